import { httpResource } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { messageOf } from '../core/api-error';
import { DirectoryEntryDto, StudyDto } from '@traceloom/shared/api';
import { ROLE_LABELS } from '../core/roles';
import { StudiesApi } from './studies-api';

/** The owner and members of a study; the owner and admins add and remove members here. */
@Component({
  selector: 'tl-study-members',
  imports: [
    FormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './study-members.html',
  styleUrl: './study-members.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyMembers {
  private readonly api = inject(StudiesApi);

  readonly study = input.required<StudyDto>();
  readonly canManage = input(false);
  /** Emits the study as the server answered it after a member change. */
  readonly changed = output<StudyDto>();

  protected readonly roleLabels = ROLE_LABELS;
  protected readonly directory = httpResource<DirectoryEntryDto[]>(
    () => (this.canManage() ? '/api/users/directory' : undefined),
    { defaultValue: [] },
  );
  /** Active users who are neither the owner nor already members. */
  protected readonly candidates = computed(() => {
    const study = this.study();
    const taken = new Set([study.owner.id, ...study.members.map((m) => m.id)]);
    const people = this.directory.hasValue() ? this.directory.value() : [];
    return people.filter((u) => !taken.has(u.id));
  });
  protected readonly directoryError = computed(() => {
    const error = this.directory.error();
    return error ? messageOf(error) : null;
  });
  protected readonly selected = signal('');
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected add(): void {
    const userId = this.selected();
    if (!userId) {
      this.error.set('Choose a person to add.');
      return;
    }
    this.run(this.api.addMember(this.study().id, userId), () => this.selected.set(''));
  }

  protected remove(member: DirectoryEntryDto): void {
    this.run(this.api.removeMember(this.study().id, member.id));
  }

  private run(call: ReturnType<StudiesApi['addMember']>, after?: () => void): void {
    this.busy.set(true);
    this.error.set(null);
    call.subscribe({
      next: (study) => {
        this.busy.set(false);
        after?.();
        this.changed.emit(study);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(messageOf(err));
      },
    });
  }
}

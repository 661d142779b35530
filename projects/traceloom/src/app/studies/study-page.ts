import { httpResource } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSnackBar } from '@angular/material/snack-bar';
import { RouterLink } from '@angular/router';
import { ApiError, messageOf } from '../core/api-error';
import { showOnField } from '../core/form-errors';
import { LIMITS, StudyDto } from '../core/api-types';
import { Session } from '../core/session';
import { notBlank } from '../core/validators';
import { StudiesApi } from './studies-api';
import { StudyMembers } from './study-members';

/** One study: its title and description (editable for those who may) and its members. */
@Component({
  selector: 'tl-study-page',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressBarModule,
    RouterLink,
    StudyMembers,
  ],
  templateUrl: './study-page.html',
  styleUrl: './study-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyPage {
  private readonly api = inject(StudiesApi);
  private readonly session = inject(Session);
  private readonly snackBar = inject(MatSnackBar);

  /** The study id, from the route. */
  readonly id = input.required<string>();

  protected readonly limits = LIMITS;
  protected readonly study = httpResource<StudyDto>(
    () => `/api/studies/${encodeURIComponent(this.id())}`,
  );
  protected readonly loadError = computed(() => {
    const error = this.study.error();
    if (!error) return null;
    return error instanceof ApiError && error.status === 404
      ? 'This study does not exist, or you are not one of its members.'
      : messageOf(error);
  });
  /** Owner, admin, or a member whose role is author or steward (API contract, PATCH). */
  protected readonly canEdit = computed(() => {
    const study = this.study.value();
    const user = this.session.user();
    if (!study || !user) return false;
    if (user.role === 'admin' || study.owner.id === user.id) return true;
    const member = study.members.some((m) => m.id === user.id);
    return member && (user.role === 'author' || user.role === 'steward');
  });
  /** Owner or admin (API contract, members add/remove). */
  protected readonly canManageMembers = computed(() => {
    const study = this.study.value();
    const user = this.session.user();
    return !!study && !!user && (user.role === 'admin' || study.owner.id === user.id);
  });

  protected readonly form = inject(NonNullableFormBuilder).group({
    title: ['', [Validators.required, notBlank, Validators.maxLength(LIMITS.titleMax)]],
    description: ['', [Validators.maxLength(LIMITS.descriptionMax)]],
  });
  protected readonly saving = signal(false);
  protected readonly saveError = signal<string | null>(null);

  constructor() {
    // Fill the form whenever a (new) study arrives.
    effect(() => {
      const study = this.study.value();
      if (study) {
        this.form.reset({ title: study.title, description: study.description ?? '' });
      }
    });
    effect(() => (this.canEdit() ? this.form.enable() : this.form.disable()));
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { title, description } = this.form.getRawValue();
    this.saving.set(true);
    this.saveError.set(null);
    this.api.update(this.id(), { title: title.trim(), description: description.trim() }).subscribe({
      next: (study) => {
        this.saving.set(false);
        this.study.value.set(study);
        this.snackBar.open('Study saved.', undefined, { duration: 3000 });
      },
      error: (err: unknown) => {
        this.saving.set(false);
        if (!showOnField(this.form, err)) this.saveError.set(messageOf(err));
      },
    });
  }

  protected onStudyChanged(study: StudyDto): void {
    this.study.value.set(study);
  }
}

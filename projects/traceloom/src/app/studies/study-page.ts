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
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatDialog } from '@angular/material/dialog';
import { MatSnackBar } from '@angular/material/snack-bar';
import { Router, RouterLink } from '@angular/router';
import { filter, switchMap } from 'rxjs';
import { ConfirmData, ConfirmDialog } from '../core/confirm-dialog';
import { ApiError, messageOf } from '../core/api-error';
import { parseForRequest, showOnField } from '../core/form-errors';
import { StudyDto, may, studyPatchSchema } from '@traceloom/shared/api';
import { Session } from '../core/session';
import { StudiesApi } from './studies-api';
import { StudyFields, studyFieldsGroup } from './study-fields';
import { StudyMembers } from './study-members';
import { StudyGases } from './study-gases';

/** One study: its title and description (editable for those who may) and its members. */
@Component({
  selector: 'tl-study-page',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    RouterLink,
    StudyFields,
    StudyMembers,
    StudyGases,
  ],
  templateUrl: './study-page.html',
  styleUrl: './study-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyPage {
  private readonly api = inject(StudiesApi);
  private readonly session = inject(Session);
  private readonly snackBar = inject(MatSnackBar);
  private readonly dialog = inject(MatDialog);
  private readonly router = inject(Router);

  /** The study id, from the route. */
  readonly id = input.required<string>();

  protected readonly study = httpResource<StudyDto>(
    () => `/api/studies/${encodeURIComponent(this.id())}`,
  );
  /** The loaded study; undefined while loading or after an error (value() throws then). */
  protected readonly current = computed(() =>
    this.study.hasValue() ? this.study.value() : undefined,
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
    const study = this.current();
    const user = this.session.user();
    if (!study || !user) return false;
    if (user.role === 'admin' || study.owner.id === user.id) return true;
    const member = study.members.some((m) => m.id === user.id);
    return member && may(user.role, 'editStudies');
  });
  /** Owner or admin (API contract: members add/remove, DELETE). */
  protected readonly canManageMembers = computed(() => {
    const study = this.current();
    const user = this.session.user();
    return !!study && !!user && (user.role === 'admin' || study.owner.id === user.id);
  });

  protected readonly form = studyFieldsGroup();
  protected readonly saving = signal(false);
  protected readonly saveError = signal<string | null>(null);

  constructor() {
    // Fill the form whenever a (new) study arrives.
    effect(() => {
      const study = this.current();
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
    this.saveError.set(null);
    const raw = { title, description: description.trim() };
    const body = parseForRequest(this.form, studyPatchSchema, raw, (m) => this.saveError.set(m));
    if (!body) return;
    this.saving.set(true);
    this.api.update(this.id(), body).subscribe({
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

  protected confirmDelete(study: StudyDto): void {
    const data: ConfirmData = {
      title: 'Delete this study?',
      message: `“${study.title}” and everything in it will be removed for all its members.`,
      confirmLabel: 'Delete study',
    };
    this.dialog
      .open<ConfirmDialog, ConfirmData, boolean>(ConfirmDialog, { data })
      .afterClosed()
      .pipe(
        filter((yes) => yes === true),
        switchMap(() => this.api.remove(study.id)),
      )
      .subscribe({
        next: () => {
          this.snackBar.open(`Study “${study.title}” deleted.`, undefined, { duration: 4000 });
          void this.router.navigate(['/studies']);
        },
        error: (err: unknown) => this.snackBar.open(messageOf(err), 'Dismiss', { duration: 6000 }),
      });
  }

  protected onStudyChanged(study: StudyDto): void {
    this.study.value.set(study);
  }
}

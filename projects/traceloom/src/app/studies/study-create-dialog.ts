import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { messageOf } from '../core/api-error';
import { parseForRequest, showOnField } from '../core/form-errors';
import { StudyDto, studyCreateSchema } from '@traceloom/shared/api';
import { StudiesApi } from './studies-api';
import { StudyFields, studyFieldsGroup } from './study-fields';

/** Asks for a title and an optional description; closes with the created study. */
@Component({
  selector: 'tl-study-create-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, StudyFields],
  templateUrl: './study-create-dialog.html',
  styleUrl: './study-create-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyCreateDialog {
  private readonly api = inject(StudiesApi);
  private readonly dialogRef = inject<MatDialogRef<StudyCreateDialog, StudyDto>>(MatDialogRef);

  protected readonly form = studyFieldsGroup();
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { title, description } = this.form.getRawValue();
    this.error.set(null);
    const raw = description.trim() ? { title, description: description.trim() } : { title };
    const body = parseForRequest(this.form, studyCreateSchema, raw, (m) => this.error.set(m));
    if (!body) return;
    this.busy.set(true);
    this.api.create(body).subscribe({
      next: (study) => this.dialogRef.close(study),
      error: (err: unknown) => {
        this.busy.set(false);
        if (!showOnField(this.form, err)) this.error.set(messageOf(err));
      },
    });
  }
}

import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { messageOf } from '../core/api-error';
import { showOnField } from '../core/form-errors';
import { LIMITS, StudyDto } from '../core/api-types';
import { notBlank } from '../core/validators';
import { StudiesApi } from './studies-api';

/** Asks for a title and an optional description; closes with the created study. */
@Component({
  selector: 'tl-study-create-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  templateUrl: './study-create-dialog.html',
  styleUrl: './study-create-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyCreateDialog {
  private readonly api = inject(StudiesApi);
  private readonly dialogRef = inject<MatDialogRef<StudyCreateDialog, StudyDto>>(MatDialogRef);

  protected readonly limits = LIMITS;
  protected readonly form = inject(NonNullableFormBuilder).group({
    title: ['', [Validators.required, notBlank, Validators.maxLength(LIMITS.titleMax)]],
    description: ['', [Validators.maxLength(LIMITS.descriptionMax)]],
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { title, description } = this.form.getRawValue();
    this.busy.set(true);
    this.error.set(null);
    const body = description.trim()
      ? { title: title.trim(), description: description.trim() }
      : { title: title.trim() };
    this.api.create(body).subscribe({
      next: (study) => this.dialogRef.close(study),
      error: (err: unknown) => {
        this.busy.set(false);
        if (!showOnField(this.form, err)) this.error.set(messageOf(err));
      },
    });
  }
}

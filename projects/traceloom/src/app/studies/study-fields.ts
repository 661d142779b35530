import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { API_LIMITS } from '@traceloom/shared/api';
import { notBlank } from '../core/validators';

/** The controls of a study's title and description. */
export type StudyFieldsGroup = FormGroup<{
  title: FormControl<string>;
  description: FormControl<string>;
}>;

/** A new title/description group with the API's limits as validators. */
export function studyFieldsGroup(): StudyFieldsGroup {
  return new FormGroup({
    title: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, notBlank, Validators.maxLength(API_LIMITS.titleMax)],
    }),
    description: new FormControl('', {
      nonNullable: true,
      validators: [Validators.maxLength(API_LIMITS.descriptionMax)],
    }),
  });
}

/** The title and description fields with their messages, for the create dialog and the study page. */
@Component({
  selector: 'tl-study-fields',
  imports: [ReactiveFormsModule, MatFormFieldModule, MatInputModule],
  templateUrl: './study-fields.html',
  styles: ':host { display: flex; flex-direction: column; } mat-form-field { width: 100%; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StudyFields {
  readonly group = input.required<StudyFieldsGroup>();
  /** Prefix of the fields' data-testid (`<prefix>-title`, `<prefix>-description`). */
  readonly testIdPrefix = input('study');
  readonly descriptionRows = input(4);

  protected readonly limits = API_LIMITS;
}

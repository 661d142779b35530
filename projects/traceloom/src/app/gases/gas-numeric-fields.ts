import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { SyntaxLink } from '../shared/syntax-link';
import { ReactiveFormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RouterLink } from '@angular/router';
import { errorText } from './field-error';
import { GasForm } from './gas-form';

/**
 * The numeric mode of a gas: the switch and the digits wanted, the number the variable is fixed
 * at (formula and spectrum gases), and the basis for closed-form recognition.
 */
@Component({
  selector: 'tl-gas-numeric-fields',
  imports: [
    SyntaxLink,
    ReactiveFormsModule,
    MatFormFieldModule,
    MatInputModule,
    MatSlideToggleModule,
    RouterLink,
  ],
  templateUrl: './gas-numeric-fields.html',
  styleUrl: './gas-numeric-fields.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class GasNumericFields {
  readonly form = input.required<GasForm>();

  protected readonly errorText = errorText;
}

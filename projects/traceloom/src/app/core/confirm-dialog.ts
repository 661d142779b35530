import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';

/** What the confirmation asks. */
export interface ConfirmData {
  title: string;
  message: string;
  confirmLabel: string;
  /** A value to show as it is (a hash), with its label. */
  code?: { label: string; value: string };
  /** A list under the message (what the action affects). */
  items?: string[];
}

/** Asks the user to confirm an action that cannot be undone; closes with true on confirm. */
@Component({
  selector: 'tl-confirm-dialog',
  imports: [MatButtonModule, MatDialogModule],
  templateUrl: './confirm-dialog.html',
  styles: 'p, ul { max-width: 480px; margin: 0 0 8px; } code { word-break: break-all; }',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ConfirmDialog {
  protected readonly data = inject<ConfirmData>(MAT_DIALOG_DATA);
}

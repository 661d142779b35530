import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { messageOf } from '../core/api-error';
import { showOnField } from '../core/form-errors';
import { InviteResponse, LIMITS, ROLES, Role } from '../core/api-types';
import { ROLE_LABELS } from '../core/roles';
import { notBlank } from '../core/validators';
import { UsersApi } from './users-api';

/** Invites a person by e-mail with a display name and a role; closes with the server's answer. */
@Component({
  selector: 'tl-user-invite-dialog',
  imports: [ReactiveFormsModule, MatButtonModule, MatDialogModule, MatFormFieldModule, MatInputModule],
  templateUrl: './user-invite-dialog.html',
  styleUrl: './user-invite-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UserInviteDialog {
  private readonly api = inject(UsersApi);
  private readonly dialogRef = inject<MatDialogRef<UserInviteDialog, InviteResponse>>(MatDialogRef);

  protected readonly limits = LIMITS;
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(LIMITS.emailMax)]],
    displayName: [
      '',
      [Validators.required, notBlank, Validators.maxLength(LIMITS.displayNameMax)],
    ],
    role: ['author' as Role, [Validators.required]],
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);

  protected send(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { email, displayName, role } = this.form.getRawValue();
    this.busy.set(true);
    this.error.set(null);
    this.api.invite({ email: email.trim(), displayName: displayName.trim(), role }).subscribe({
      next: (res) => this.dialogRef.close(res),
      error: (err: unknown) => {
        this.busy.set(false);
        // 409 email_taken may come without a field; it belongs under the e-mail all the same.
        const placed = showOnField(this.form, err, (e) =>
          e.code === 'email_taken' ? 'email' : undefined,
        );
        if (!placed) this.error.set(messageOf(err));
      },
    });
  }
}

import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { messageOf } from '../core/api-error';
import { parseForRequest, showOnField } from '../core/form-errors';
import { API_LIMITS, InviteResponse, ROLES, Role, inviteSchema } from '@traceloom/shared/api';
import { ROLE_LABELS } from '../core/roles';
import { notBlank } from '../core/validators';
import { UsersApi } from './users-api';

/** Invites a person by e-mail with a display name and a role; closes with the server's answer. */
@Component({
  selector: 'tl-user-invite-dialog',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './user-invite-dialog.html',
  styleUrl: './user-invite-dialog.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UserInviteDialog {
  private readonly api = inject(UsersApi);
  private readonly dialogRef = inject<MatDialogRef<UserInviteDialog, InviteResponse>>(MatDialogRef);

  protected readonly limits = API_LIMITS;
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(API_LIMITS.emailMax)]],
    displayName: [
      '',
      [Validators.required, notBlank, Validators.maxLength(API_LIMITS.displayNameMax)],
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
    this.error.set(null);
    const body = parseForRequest(this.form, inviteSchema, this.form.getRawValue(), (m) =>
      this.error.set(m),
    );
    if (!body) return;
    this.busy.set(true);
    this.api.invite(body).subscribe({
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

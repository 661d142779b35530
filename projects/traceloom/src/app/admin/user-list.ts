import { httpResource } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelect, MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { messageOf } from '../core/api-error';
import { InviteResponse, ROLES, Role, UserDto } from '@traceloom/shared/api';
import { ROLE_LABELS } from '../core/roles';
import { Session } from '../core/session';
import { UserInviteDialog } from './user-invite-dialog';
import { UsersApi } from './users-api';

/** The admin's table of people: invite, change a role, disable or enable an account. */
@Component({
  selector: 'tl-user-list',
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
  ],
  templateUrl: './user-list.html',
  styleUrl: './user-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UserList {
  private readonly api = inject(UsersApi);
  private readonly dialog = inject(MatDialog);
  private readonly snackBar = inject(MatSnackBar);
  private readonly session = inject(Session);

  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly users = httpResource<UserDto[]>(() => '/api/users', { defaultValue: [] });
  /** The loaded list; empty while loading or after an error (value() throws then). */
  protected readonly list = computed(() => (this.users.hasValue() ? this.users.value() : []));
  protected readonly errorMessage = computed(() => {
    const error = this.users.error();
    return error ? messageOf(error) : null;
  });
  protected readonly me = computed(() => this.session.user()?.id ?? null);
  /** The id of the row being saved, to disable its controls meanwhile. */
  protected readonly pending = signal<string | null>(null);

  protected openInvite(): void {
    this.dialog
      .open<UserInviteDialog, void, InviteResponse>(UserInviteDialog)
      .afterClosed()
      .subscribe((res) => {
        if (!res) return;
        this.users.value.update((list) => [...list, res.user]);
        this.snackBar.open(`Invitation recorded for ${res.invitation.email}.`, undefined, {
          duration: 4000,
        });
      });
  }

  /** Disabled, Invited (no password set yet) or Active. */
  protected statusLabel(user: UserDto): string {
    return user.disabled ? 'Disabled' : user.invited ? 'Invited' : 'Active';
  }

  protected statusIcon(user: UserDto): string {
    return user.disabled ? 'block' : user.invited ? 'mail' : 'check_circle';
  }

  protected changeRole(user: UserDto, role: string, select: MatSelect): void {
    if (role === user.role) return;
    // Put the old value back until the server agrees; the answer then updates the row.
    select.value = user.role;
    this.save(
      user,
      { role: role as Role },
      `${user.displayName} is now ${ROLE_LABELS[role as Role]}.`,
    );
  }

  protected toggleDisabled(user: UserDto): void {
    const disabled = !user.disabled;
    const done = `${user.displayName} is ${disabled ? 'disabled' : 'enabled'}.`;
    this.save(user, { disabled }, done);
  }

  protected resendInvitation(user: UserDto): void {
    this.pending.set(user.id);
    this.api.resendInvitation(user.id).subscribe({
      next: (res) => {
        this.pending.set(null);
        this.snackBar.open(`Invitation sent again to ${res.invitation.email}.`, undefined, {
          duration: 3000,
        });
      },
      error: (err: unknown) => {
        this.pending.set(null);
        this.snackBar.open(messageOf(err), 'Dismiss', { duration: 6000 });
      },
    });
  }

  private save(user: UserDto, body: { role?: Role; disabled?: boolean }, done: string): void {
    this.pending.set(user.id);
    this.api.update(user.id, body).subscribe({
      next: (updated) => {
        this.pending.set(null);
        this.users.value.update((list) => list.map((u) => (u.id === updated.id ? updated : u)));
        this.snackBar.open(done, undefined, { duration: 3000 });
      },
      error: (err: unknown) => {
        this.pending.set(null);
        this.snackBar.open(messageOf(err), 'Dismiss', { duration: 6000 });
      },
    });
  }
}

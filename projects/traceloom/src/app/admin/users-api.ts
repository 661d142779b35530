import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Observable } from 'rxjs';
import { InviteResponse, Role, UserDto } from '@traceloom/shared/api';

/** The admin's user endpoints (writes; the list is read with httpResource). */
@Injectable({ providedIn: 'root' })
export class UsersApi {
  private readonly http = inject(HttpClient);

  /** Records an invitation and creates the invited user without a usable password. */
  invite(body: { email: string; displayName: string; role: Role }): Observable<InviteResponse> {
    return this.http.post<InviteResponse>('/api/users', body);
  }

  /** Mails an invited person who has not chosen a password a fresh invitation. */
  resendInvitation(id: string): Observable<{ invitation: { id: string; email: string } }> {
    return this.http.post<{ invitation: { id: string; email: string } }>(
      `/api/users/${encodeURIComponent(id)}/invitations`,
      {},
    );
  }

  /** Changes a user's role, display name or disabled flag. */
  update(
    id: string,
    body: { role?: Role; disabled?: boolean; displayName?: string },
  ): Observable<UserDto> {
    return this.http.patch<UserDto>(`/api/users/${encodeURIComponent(id)}`, body);
  }
}

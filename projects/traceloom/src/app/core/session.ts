import { HttpClient } from '@angular/common/http';
import { Injectable, computed, inject, signal } from '@angular/core';
import { Observable, firstValueFrom, map, tap } from 'rxjs';
import { LoginResponse, Role, UserDto } from '@traceloom/shared/api';

const TOKEN_KEY = 'traceloom.token';
const EXPIRES_KEY = 'traceloom.expiresAt';

/**
 * The signed-in session: the bearer token lives in sessionStorage (one browser tab, gone when the
 * tab closes) and the current user in a signal.
 */
@Injectable({ providedIn: 'root' })
export class Session {
  private readonly http = inject(HttpClient);
  private readonly tokenState = signal<string | null>(readStoredToken());
  private readonly userState = signal<UserDto | null>(null);

  /** The bearer token, or null when signed out. */
  readonly token = this.tokenState.asReadonly();
  /** The signed-in user, or null. */
  readonly user = this.userState.asReadonly();
  readonly role = computed<Role | null>(() => this.userState()?.role ?? null);
  readonly signedIn = computed(() => this.tokenState() !== null && this.userState() !== null);

  /** Signs in; on success stores the token and the user. Errors arrive as ApiError. */
  signIn(email: string, password: string): Observable<UserDto> {
    return this.http.post<LoginResponse>('/api/auth/login', { email, password }).pipe(
      tap((res) => this.store(res)),
      map((res) => res.user),
    );
  }

  /**
   * Loads the user for a stored token (at start-up). Resolves false and forgets the token when it
   * no longer works; never rejects.
   */
  async restore(): Promise<boolean> {
    if (!this.tokenState()) return false;
    try {
      this.userState.set(await firstValueFrom(this.http.get<UserDto>('/api/auth/me')));
      return true;
    } catch {
      this.clear();
      return false;
    }
  }

  /** Revokes the token on the server (best effort) and forgets it here. */
  async signOut(): Promise<void> {
    if (this.tokenState()) {
      try {
        await firstValueFrom(this.http.post<void>('/api/auth/logout', {}));
      } catch {
        // The token may already be invalid; signing out locally is what matters.
      }
    }
    this.clear();
  }

  /** Forgets the session locally (used after a 401). */
  clear(): void {
    sessionStorage.removeItem(TOKEN_KEY);
    sessionStorage.removeItem(EXPIRES_KEY);
    this.tokenState.set(null);
    this.userState.set(null);
  }

  private store(res: LoginResponse): void {
    sessionStorage.setItem(TOKEN_KEY, res.token);
    sessionStorage.setItem(EXPIRES_KEY, res.expiresAt);
    this.tokenState.set(res.token);
    this.userState.set(res.user);
  }
}

function readStoredToken(): string | null {
  const token = sessionStorage.getItem(TOKEN_KEY);
  const expiresAt = Date.parse(sessionStorage.getItem(EXPIRES_KEY) ?? '');
  if (!token || !(expiresAt > Date.now())) return null;
  return token;
}

import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressSpinnerModule } from '@angular/material/progress-spinner';
import { ActivatedRoute, Router } from '@angular/router';
import { catchError, map, of } from 'rxjs';
import { messageOf } from '../core/api-error';
import { API_LIMITS, HealthDto, loginSchema, passwordResetSchema } from '@traceloom/shared/api';
import { parseForRequest } from '../core/form-errors';
import { Session } from '../core/session';
import { LogoMark } from '../shell/logo-mark';

/** The sign-in page: e-mail and password, with the server's answer shown inline. */
@Component({
  selector: 'tl-sign-in',
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatProgressSpinnerModule,
    LogoMark,
  ],
  templateUrl: './sign-in.html',
  styleUrl: './sign-in.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SignIn {
  private readonly session = inject(Session);
  private readonly router = inject(Router);
  private readonly route = inject(ActivatedRoute);

  protected readonly limits = API_LIMITS;
  protected readonly form = inject(NonNullableFormBuilder).group({
    email: ['', [Validators.required, Validators.email, Validators.maxLength(API_LIMITS.emailMax)]],
    password: ['', [Validators.required, Validators.maxLength(API_LIMITS.passwordMax)]],
  });
  protected readonly busy = signal(false);
  protected readonly error = signal<string | null>(null);
  protected readonly hidePassword = signal(true);
  /** The server's answer to a password-reset request. */
  protected readonly notice = signal<string | null>(null);
  private readonly http = inject(HttpClient);
  /** The demo sign-in is shown only when the server runs in demo mode. */
  protected readonly demo = toSignal(
    this.http.get<HealthDto & { mode?: string }>('/api/health').pipe(
      map((h) => h.mode === 'demo'),
      catchError(() => of(false)),
    ),
    { initialValue: false },
  );

  protected submit(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.error.set(null);
    const body = parseForRequest(this.form, loginSchema, this.form.getRawValue(), (m) =>
      this.error.set(m),
    );
    if (!body) return;
    this.busy.set(true);
    this.session.signIn(body.email, body.password).subscribe({
      next: () => {
        this.busy.set(false);
        void this.router.navigateByUrl(this.nextUrl());
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(messageOf(err));
      },
    });
  }

  /** Asks the server to mail a link for a new password to the address in the e-mail field. */
  protected forgot(): void {
    const email = this.form.controls.email;
    email.markAsTouched();
    if (email.invalid) return;
    this.error.set(null);
    const body = passwordResetSchema.safeParse({ email: email.value });
    if (!body.success) return;
    this.http.post<{ message: string }>('/api/auth/password-reset', body.data).subscribe({
      next: (answer) => this.notice.set(answer.message),
      error: (err: unknown) => this.error.set(messageOf(err)),
    });
  }

  private nextUrl(): string {
    const next = this.route.snapshot.queryParamMap.get('next');
    // Only paths inside the app: never an absolute URL from the query string.
    return next && next.startsWith('/') && !next.startsWith('//') ? next : '/studies';
  }
}

import { HttpClient } from '@angular/common/http';
import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';
import { invitationAcceptSchema } from '@traceloom/shared/api';
import { messageOf } from '../core/api-error';
import { LogoMark } from '../shell/logo-mark';

/** `/welcome/:key` (no sign-in): the invited person chooses their first password. */
@Component({
  selector: 'tl-welcome',
  imports: [MatButtonModule, MatFormFieldModule, MatInputModule, RouterLink, LogoMark],
  template: `
    <main class="card">
      <h1><tl-logo-mark /> Welcome to Traceloom</h1>
      @if (done()) {
        <p data-testid="welcome-done">Your password is set.</p>
        <a mat-flat-button routerLink="/sign-in">Sign in</a>
      } @else {
        <p>Choose the password you will sign in with (at least 12 characters).</p>
        <form (submit)="$event.preventDefault(); save()">
          <mat-form-field>
            <mat-label>Password</mat-label>
            <input
              matInput
              type="password"
              autocomplete="new-password"
              [value]="password()"
              (input)="password.set($any($event.target).value)"
              data-testid="welcome-password"
            />
          </mat-form-field>
          <mat-form-field>
            <mat-label>The same again</mat-label>
            <input
              matInput
              type="password"
              autocomplete="new-password"
              [value]="again()"
              (input)="again.set($any($event.target).value)"
              data-testid="welcome-again"
            />
          </mat-form-field>
          @if (error(); as e) {
            <p class="error" role="alert" data-testid="welcome-error">{{ e }}</p>
          }
          <button mat-flat-button type="submit" [disabled]="busy()" data-testid="welcome-submit">
            Set password
          </button>
        </form>
      }
    </main>
  `,
  styles: `
    :host {
      display: flex;
      justify-content: center;
      padding: 48px 16px;
    }
    .card {
      max-width: 440px;
      width: 100%;
      padding: 24px;
      border-top: 4px solid var(--tl-amber);
      background: var(--mat-sys-surface-container-lowest);
      border-radius: var(--tl-radius);
    }
    h1 {
      display: flex;
      gap: 10px;
      align-items: center;
      font: var(--mat-sys-headline-small);
      color: var(--tl-ink);
    }
    form {
      display: flex;
      flex-direction: column;
    }
    .error {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Welcome {
  private readonly http = inject(HttpClient);

  /** Route `welcome/:key`. */
  readonly key = input.required<string>();

  protected readonly password = signal('');
  protected readonly again = signal('');
  protected readonly busy = signal(false);
  protected readonly done = signal(false);
  protected readonly error = signal<string | null>(null);

  protected save(): void {
    if (this.password() !== this.again()) {
      this.error.set('The two passwords differ.');
      return;
    }
    const parsed = invitationAcceptSchema.safeParse({ key: this.key(), password: this.password() });
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      this.error.set(
        `${issue?.path.join('.') === 'key' ? 'This link' : 'Password'}: ${issue?.message ?? 'invalid'}.`,
      );
      return;
    }
    this.busy.set(true);
    this.error.set(null);
    this.http.post('/api/invitations/accept', parsed.data).subscribe({
      next: () => {
        this.busy.set(false);
        this.done.set(true);
      },
      error: (err: unknown) => {
        this.busy.set(false);
        this.error.set(messageOf(err));
      },
    });
  }
}

import { BreakpointObserver } from '@angular/cdk/layout';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  signal,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatListModule } from '@angular/material/list';
import { MatSidenavModule } from '@angular/material/sidenav';
import { MatToolbarModule } from '@angular/material/toolbar';
import { Router, RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';
import { navItemsFor } from '../core/nav-items';
import { ROLE_LABELS } from '../core/roles';
import { Session } from '../core/session';
import { LogoMark } from './logo-mark';

/** The signed-in frame: top bar with the user, side navigation for the user's role, and content. */
@Component({
  selector: 'tl-shell',
  imports: [
    MatButtonModule,
    MatIconModule,
    MatListModule,
    MatSidenavModule,
    MatToolbarModule,
    RouterLink,
    RouterLinkActive,
    RouterOutlet,
    LogoMark,
  ],
  templateUrl: './shell.html',
  styleUrl: './shell.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class Shell {
  private readonly session = inject(Session);
  private readonly router = inject(Router);

  protected readonly user = this.session.user;
  protected readonly navItems = computed(() => navItemsFor(this.session.role()));
  protected readonly roleLabel = computed(() => {
    const role = this.session.role();
    return role ? ROLE_LABELS[role] : '';
  });
  /** On narrow windows the navigation slides over the content and starts closed. */
  protected readonly narrow = toSignal(
    inject(BreakpointObserver)
      .observe('(max-width: 900px)')
      .pipe(map((state) => state.matches)),
    { initialValue: false },
  );
  protected readonly navOpen = signal(true);
  protected readonly signingOut = signal(false);

  constructor() {
    effect(() => this.navOpen.set(!this.narrow()));
  }

  /** After following a link on a narrow window, give the content the room again. */
  protected navigated(): void {
    if (this.narrow()) this.navOpen.set(false);
  }

  protected async signOut(): Promise<void> {
    this.signingOut.set(true);
    await this.session.signOut();
    this.signingOut.set(false);
    await this.router.navigate(['/sign-in']);
  }
}

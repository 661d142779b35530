import { inject } from '@angular/core';
import { CanActivateFn, Router } from '@angular/router';
import { Role } from '@traceloom/shared/api';
import { Session } from './session';

/** Lets signed-in users through; sends everyone else to /sign-in, remembering where they were. */
export const signedInGuard: CanActivateFn = (_route, state) => {
  const session = inject(Session);
  if (session.signedIn()) return true;
  return inject(Router).createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
};

/** Keeps signed-in users away from the sign-in page. */
export const signedOutGuard: CanActivateFn = () =>
  inject(Session).signedIn() ? inject(Router).createUrlTree(['/studies']) : true;

/**
 * Allows only the given roles. Signed-out users go to /sign-in; signed-in users with another role
 * go back to the studies list (the side navigation never offers them the link).
 */
export function roleGuard(...roles: Role[]): CanActivateFn {
  return (_route, state) => {
    const session = inject(Session);
    const router = inject(Router);
    const role = session.role();
    if (!session.signedIn() || !role) {
      return router.createUrlTree(['/sign-in'], { queryParams: { next: state.url } });
    }
    return roles.includes(role) ? true : router.createUrlTree(['/studies']);
  };
}

import { TestBed } from '@angular/core/testing';
import { ActivatedRouteSnapshot, Router, RouterStateSnapshot, UrlTree } from '@angular/router';
import { Role } from '@traceloom/shared/api';
import { roleGuard, signedInGuard } from './guards';
import { signInAs, testProviders } from './session-testing';

describe('route guards', () => {
  beforeEach(() => {
    sessionStorage.clear();
    TestBed.configureTestingModule({
      providers: testProviders(),
    });
  });

  const state = { url: '/admin/users' } as RouterStateSnapshot;
  const route = {} as ActivatedRouteSnapshot;

  function runRoleGuard(...roles: Role[]): boolean | UrlTree {
    return TestBed.runInInjectionContext(() => roleGuard(...roles)(route, state)) as
      boolean | UrlTree;
  }

  function serialize(result: boolean | UrlTree): string | boolean {
    return result instanceof UrlTree ? TestBed.inject(Router).serializeUrl(result) : result;
  }

  it('sends a signed-out visitor to /sign-in with the page they wanted', () => {
    expect(serialize(runRoleGuard('admin'))).toBe('/sign-in?next=%2Fadmin%2Fusers');
    const plain = TestBed.runInInjectionContext(() => signedInGuard(route, state));
    expect(serialize(plain as UrlTree)).toBe('/sign-in?next=%2Fadmin%2Fusers');
  });

  it.each<[Role, string | boolean]>([
    ['admin', true],
    ['author', '/studies'],
    ['reviewer', '/studies'],
    ['steward', '/studies'],
  ])('roleGuard("admin") for %s -> %s', (role, expected) => {
    signInAs(role);
    expect(serialize(runRoleGuard('admin'))).toBe(expected);
  });

  it('admits every listed role', () => {
    signInAs('steward');
    expect(runRoleGuard('author', 'steward')).toBe(true);
  });

  it('lets any signed-in user through signedInGuard', () => {
    signInAs('reviewer');
    expect(TestBed.runInInjectionContext(() => signedInGuard(route, state))).toBe(true);
  });
});

import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { Role } from '@traceloom/shared/api';
import { Session } from '../core/session';
import { signInAs, testProviders } from '../core/session-testing';
import { Shell } from './shell';

describe('Shell', () => {
  beforeEach(() => {
    sessionStorage.clear();
    TestBed.configureTestingModule({
      imports: [Shell],
      providers: testProviders(),
    });
  });

  async function render(role: Role): Promise<HTMLElement> {
    signInAs(role);
    const fixture = TestBed.createComponent(Shell);
    await fixture.whenStable();
    return fixture.nativeElement as HTMLElement;
  }

  function navIds(el: HTMLElement): (string | null)[] {
    return [...el.querySelectorAll('[data-testid^="nav-"]:not([data-testid="nav-toggle"])')].map(
      (a) => a.getAttribute('data-testid'),
    );
  }

  it.each<[Role, string[]]>([
    ['author', ['nav-studies', 'nav-datasets', 'nav-help']],
    ['reviewer', ['nav-studies', 'nav-datasets', 'nav-reviews', 'nav-help']],
    ['steward', ['nav-studies', 'nav-datasets', 'nav-reviews', 'nav-audit', 'nav-help']],
    ['admin', ['nav-studies', 'nav-datasets', 'nav-audit', 'nav-users', 'nav-mailbox', 'nav-help']],
  ])('shows %s only the navigation that role may use', async (role, expected) => {
    const el = await render(role);
    expect(navIds(el)).toEqual(expected);
  });

  it('names the signed-in user and their role in words', async () => {
    const el = await render('steward');
    expect(el.querySelector('[data-testid="current-user"]')?.textContent).toContain('Test steward');
    expect(el.querySelector('[data-testid="current-role"]')?.textContent?.trim()).toBe('Steward');
  });

  it('signs out on the server, forgets the session and goes to /sign-in', async () => {
    const el = await render('author');
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    (el.querySelector('[data-testid="sign-out"]') as HTMLButtonElement).click();
    const req = TestBed.inject(HttpTestingController).expectOne('/api/auth/logout');
    expect(req.request.headers.get('Authorization')).toBe('Bearer token-author');
    req.flush(null, { status: 204, statusText: 'No Content' });
    await vi.waitFor(() => expect(navigate).toHaveBeenCalledWith(['/sign-in']));
    expect(TestBed.inject(Session).signedIn()).toBe(false);
  });
});

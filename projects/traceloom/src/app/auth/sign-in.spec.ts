import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { Session } from '../core/session';
import { testProviders, testUser } from '../core/session-testing';
import { SignIn } from './sign-in';

describe('SignIn', () => {
  let fixture: ComponentFixture<SignIn>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;

  async function setUp(healthMode?: string): Promise<void> {
    sessionStorage.clear();
    TestBed.configureTestingModule({
      imports: [SignIn],
      providers: testProviders(),
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(SignIn);
    el = fixture.nativeElement;
    await fixture.whenStable();
    httpTesting
      .expectOne('/api/health')
      .flush({ status: 'ok', version: '0.1.0', database: 'ok', mode: healthMode });
    await fixture.whenStable();
  }

  function byTestId<T extends HTMLElement>(id: string): T {
    return el.querySelector(`[data-testid="${id}"]`) as T;
  }

  async function type(id: string, value: string): Promise<void> {
    const input = byTestId<HTMLInputElement>(id);
    input.value = value;
    input.dispatchEvent(new Event('input'));
    input.dispatchEvent(new Event('blur'));
    await fixture.whenStable();
  }

  async function submit(): Promise<void> {
    byTestId<HTMLButtonElement>('sign-in-submit').click();
    await fixture.whenStable();
  }

  afterEach(() => httpTesting.verify());

  it('asks for both fields and sends nothing when they are empty', async () => {
    await setUp();
    await submit();
    const errors = [...el.querySelectorAll('mat-error')].map((e) => e.textContent?.trim());
    expect(errors).toEqual(['Enter your e-mail address.', 'Enter your password.']);
    httpTesting.expectNone('/api/auth/login');
  });

  it('rejects a malformed e-mail on the field', async () => {
    await setUp();
    await type('sign-in-email', 'not-an-address');
    await type('sign-in-password', 'secret');
    await submit();
    expect(el.querySelector('mat-error')?.textContent).toContain('not a valid e-mail address');
    httpTesting.expectNone('/api/auth/login');
  });

  it("shows the server's message inline when the sign-in is refused", async () => {
    await setUp();
    await type('sign-in-email', 'ada@example.test');
    await type('sign-in-password', 'wrong');
    await submit();
    httpTesting
      .expectOne('/api/auth/login')
      .flush(
        { error: { code: 'invalid_credentials', message: 'The e-mail or password is not right.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    await fixture.whenStable();
    expect(byTestId('sign-in-error').textContent).toContain('The e-mail or password is not right.');
    expect(byTestId('sign-in-error').getAttribute('role')).toBe('alert');
  });

  it('signs in with the trimmed, lower-cased e-mail and goes to the studies', async () => {
    await setUp();
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigateByUrl').mockResolvedValue(true);
    await type('sign-in-email', '  Ada@Example.TEST ');
    await type('sign-in-password', 'traceloom-demo');
    await submit();
    const req = httpTesting.expectOne('/api/auth/login');
    expect(req.request.body).toEqual({ email: 'ada@example.test', password: 'traceloom-demo' });
    req.flush({
      token: 't',
      expiresAt: new Date(Date.now() + 60_000).toISOString(),
      user: testUser('author'),
    });
    await fixture.whenStable();
    expect(TestBed.inject(Session).role()).toBe('author');
    expect(navigate).toHaveBeenCalledWith('/studies');
    expect(byTestId('sign-in-error')).toBeNull();
  });

  it('shows the demo sign-in only when the server runs in demo mode', async () => {
    await setUp('demo');
    expect(byTestId('sign-in-demo-hint')?.textContent).toContain('author@demo.test');
    TestBed.resetTestingModule();
    await setUp('production');
    expect(byTestId('sign-in-demo-hint')).toBeNull();
  });

  it('mails a link for a new password to the address in the e-mail field', async () => {
    await setUp();
    byTestId<HTMLButtonElement>('sign-in-forgot').click();
    await fixture.whenStable();
    httpTesting.expectNone('/api/auth/password-reset');
    await type('sign-in-email', 'ada@example.test');
    byTestId<HTMLButtonElement>('sign-in-forgot').click();
    const req = httpTesting.expectOne('/api/auth/password-reset');
    expect(req.request.body).toEqual({ email: 'ada@example.test' });
    req.flush({ message: 'If an active account has this address, a link is on its way.' });
    await fixture.whenStable();
    expect(byTestId('sign-in-reset-notice').textContent).toContain('a link is on its way');
  });
});

import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Session } from './session';
import { testProviders, testUser } from './session-testing';

describe('Session', () => {
  function setUp(
    token: string | null,
    expiresInMs: number,
  ): {
    session: Session;
    httpTesting: HttpTestingController;
  } {
    sessionStorage.clear();
    if (token) {
      sessionStorage.setItem('traceloom.token', token);
      sessionStorage.setItem(
        'traceloom.expiresAt',
        new Date(Date.now() + expiresInMs).toISOString(),
      );
    }
    TestBed.configureTestingModule({
      providers: testProviders([{ path: 'sign-in', children: [] }]),
    });
    return { session: TestBed.inject(Session), httpTesting: TestBed.inject(HttpTestingController) };
  }

  it('restores a stored, unexpired token by asking the server who it belongs to', async () => {
    const { session, httpTesting } = setUp('stored-token', 60_000);
    const restored = session.restore();
    const req = httpTesting.expectOne('/api/auth/me');
    expect(req.request.headers.get('Authorization')).toBe('Bearer stored-token');
    req.flush(testUser('steward'));
    expect(await restored).toBe(true);
    expect(session.signedIn()).toBe(true);
    expect(session.role()).toBe('steward');
    httpTesting.verify();
  });

  it('ignores an expired token without asking the server', async () => {
    const { session, httpTesting } = setUp('old-token', -1000);
    expect(await session.restore()).toBe(false);
    expect(session.token()).toBeNull();
    httpTesting.verify();
  });

  it('forgets a token the server no longer accepts', async () => {
    const { session, httpTesting } = setUp('revoked-token', 60_000);
    const restored = session.restore();
    httpTesting
      .expectOne('/api/auth/me')
      .flush(
        { error: { code: 'unauthenticated', message: 'Sign in again.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    expect(await restored).toBe(false);
    expect(session.signedIn()).toBe(false);
    expect(sessionStorage.getItem('traceloom.token')).toBeNull();
    httpTesting.verify();
  });

  it('signs out locally even when the server cannot be reached', async () => {
    const { session, httpTesting } = setUp('live-token', 60_000);
    const done = session.signOut();
    httpTesting.expectOne('/api/auth/logout').error(new ProgressEvent('error'), { status: 0 });
    await done;
    expect(session.token()).toBeNull();
    expect(sessionStorage.getItem('traceloom.token')).toBeNull();
  });
});

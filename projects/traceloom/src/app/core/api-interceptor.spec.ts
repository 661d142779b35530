import { HttpClient } from '@angular/common/http';
import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { ApiError } from './api-error';
import { Session } from './session';
import { signInAs, testProviders } from './session-testing';

describe('apiInterceptor', () => {
  let http: HttpClient;
  let httpTesting: HttpTestingController;

  beforeEach(() => {
    sessionStorage.clear();
    TestBed.configureTestingModule({
      providers: testProviders(),
    });
    http = TestBed.inject(HttpClient);
    httpTesting = TestBed.inject(HttpTestingController);
  });

  afterEach(() => httpTesting.verify());

  /** Starts a GET and returns the promise of its outcome (value or thrown error). */
  function get(url: string): Promise<unknown> {
    return firstValueFrom(http.get(url)).catch((e: unknown) => e);
  }

  it('adds the bearer token to API requests once signed in', () => {
    signInAs('author');
    void get('/api/studies');
    const req = httpTesting.expectOne('/api/studies');
    expect(req.request.headers.get('Authorization')).toBe('Bearer token-author');
    req.flush([]);
  });

  it('sends no Authorization header when signed out, nor to non-API URLs', () => {
    void get('/api/health');
    expect(httpTesting.expectOne('/api/health').request.headers.has('Authorization')).toBe(false);
    signInAs('author');
    void get('/fonts/roboto/LICENSE');
    const req = httpTesting.expectOne('/fonts/roboto/LICENSE');
    expect(req.request.headers.has('Authorization')).toBe(false);
    req.flush('');
  });

  it('turns the contract error body into an ApiError with status, code, message and field', async () => {
    const outcome = get('/api/studies');
    httpTesting.expectOne('/api/studies').flush(
      {
        error: { code: 'invalid_body', message: 'title must not be empty', field: 'body.title' },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    const error = await outcome;
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({
      status: 400,
      code: 'invalid_body',
      message: 'title must not be empty',
      field: 'body.title',
    });
  });

  it('gives a plain sentence when the body is not the contract shape', async () => {
    const outcome = get('/api/studies');
    httpTesting
      .expectOne('/api/studies')
      .flush('<html>proxy error</html>', { status: 502, statusText: 'Bad Gateway' });
    const error = (await outcome) as ApiError;
    expect(error.code).toBe('http_502');
    expect(error.message).toBe('The server answered with status 502.');
    expect(error.message).not.toContain('html');
  });

  it('reports an unreachable server as network_error', async () => {
    const outcome = get('/api/studies');
    httpTesting.expectOne('/api/studies').error(new ProgressEvent('error'), { status: 0 });
    expect(await outcome).toMatchObject({ status: 0, code: 'network_error' });
  });

  it('signs out and goes to /sign-in on a 401', async () => {
    signInAs('steward');
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    const outcome = get('/api/studies');
    httpTesting
      .expectOne('/api/studies')
      .flush(
        { error: { code: 'unauthenticated', message: 'Sign in again.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    expect(await outcome).toMatchObject({ status: 401, code: 'unauthenticated' });
    const session = TestBed.inject(Session);
    expect(session.token()).toBeNull();
    expect(session.user()).toBeNull();
    expect(sessionStorage.getItem('traceloom.token')).toBeNull();
    expect(navigate).toHaveBeenCalledWith(['/sign-in'], expect.anything());
  });

  it('leaves a failed sign-in to the sign-in page (no redirect)', async () => {
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate');
    const outcome = firstValueFrom(TestBed.inject(Session).signIn('a@b.test', 'x')).catch(
      (e: unknown) => e,
    );
    httpTesting
      .expectOne('/api/auth/login')
      .flush(
        { error: { code: 'invalid_credentials', message: 'E-mail or password is wrong.' } },
        { status: 401, statusText: 'Unauthorized' },
      );
    expect(await outcome).toMatchObject({ code: 'invalid_credentials' });
    expect(navigate).not.toHaveBeenCalled();
  });
});

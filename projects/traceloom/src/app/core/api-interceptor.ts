import { HttpErrorResponse, HttpInterceptorFn } from '@angular/common/http';
import { inject } from '@angular/core';
import { Router } from '@angular/router';
import { catchError, throwError } from 'rxjs';
import { toApiError } from './api-error';
import { Session } from './session';

const LOGIN_URL = '/api/auth/login';

/**
 * Adds the bearer token to every /api request and turns error responses into ApiError. A 401 on
 * anything but the sign-in request ends the session and sends the user to the sign-in page.
 */
export const apiInterceptor: HttpInterceptorFn = (req, next) => {
  const session = inject(Session);
  const router = inject(Router);
  const token = session.token();
  const isApi = req.url.startsWith('/api/');
  const outgoing =
    isApi && token ? req.clone({ setHeaders: { Authorization: `Bearer ${token}` } }) : req;

  return next(outgoing).pipe(
    catchError((err: unknown) => {
      if (!(err instanceof HttpErrorResponse)) return throwError(() => err);
      const apiError = toApiError(err);
      if (isApi && apiError.status === 401 && req.url !== LOGIN_URL && session.token()) {
        session.clear();
        const next = router.url.startsWith('/sign-in') ? undefined : router.url;
        void router.navigate(['/sign-in'], { queryParams: next ? { next } : {} });
      }
      return throwError(() => apiError);
    }),
  );
};

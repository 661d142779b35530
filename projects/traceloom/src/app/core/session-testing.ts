import { provideHttpClient, withInterceptors } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { EnvironmentProviders, Provider, provideZonelessChangeDetection } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { Routes, provideRouter } from '@angular/router';
import { Role, UserDto } from '@traceloom/shared/api';
import { apiInterceptor } from './api-interceptor';
import { Session } from './session';

/**
 * The providers every client unit test starts from: zoneless change detection, no animations,
 * the router with `routes`, HttpClient through our interceptor, and HttpTestingController.
 */
export function testProviders(routes: Routes = []): (Provider | EnvironmentProviders)[] {
  return [
    provideZonelessChangeDetection(),
    { provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } },
    provideRouter(routes),
    provideHttpClient(withInterceptors([apiInterceptor])),
    provideHttpClientTesting(),
  ];
}

/** A user of the given role, for unit tests. */
export function testUser(role: Role, overrides: Partial<UserDto> = {}): UserDto {
  return {
    id: `00000000-0000-4000-8000-00000000000${'arsd'.indexOf(role[0]) + 1}`,
    email: `${role}@example.test`,
    displayName: `Test ${role}`,
    role,
    disabled: false,
    invited: false,
    createdAt: '2026-01-01T00:00:00.000Z',
    ...overrides,
  };
}

/**
 * Signs the TestBed's Session in as a user of `role` by answering the sign-in request through
 * HttpTestingController (so the session is filled exactly as in the app).
 */
export function signInAs(role: Role, overrides: Partial<UserDto> = {}): UserDto {
  const user = testUser(role, overrides);
  TestBed.inject(Session).signIn(user.email, 'secret').subscribe();
  TestBed.inject(HttpTestingController)
    .expectOne('/api/auth/login')
    .flush({
      token: `token-${role}`,
      expiresAt: new Date(Date.now() + 600_000).toISOString(),
      user,
    });
  return user;
}

import { Component, signal } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { ApiError } from '../core/api-error';
import { testProviders } from '../core/session-testing';
import { AsyncState, type ResourceLike } from './async-state';

/** A resource whose state the test sets. */
function fakeResource() {
  const loading = signal(true);
  const value = signal(false);
  const error = signal<unknown>(undefined);
  const resource: ResourceLike = {
    isLoading: () => loading(),
    hasValue: () => value(),
    error: () => error(),
  };
  return { resource, loading, value, error };
}

@Component({
  imports: [AsyncState],
  template: `<tl-async-state
    [resource]="r.resource"
    [empty]="empty()"
    emptyText="No runs yet."
    loadingLabel="Loading the runs"
    notFound="This run does not exist, or you are not a member of its study."
    testId="runs"
  >
    <button stateAction type="button">Try again</button>
    <p class="content">the runs</p>
  </tl-async-state>`,
})
class Host {
  readonly r = fakeResource();
  readonly empty = signal(false);
}

describe('AsyncState', () => {
  it('shows loading, then the content, the empty sentence, or the error in words', async () => {
    TestBed.configureTestingModule({ imports: [Host], providers: testProviders() });
    const fixture = TestBed.createComponent(Host);
    const host = fixture.componentInstance;
    const el: HTMLElement = fixture.nativeElement;
    await fixture.whenStable();
    expect(el.querySelector('mat-progress-bar')?.getAttribute('aria-label')).toBe(
      'Loading the runs',
    );
    expect(el.querySelector('.content')).toBeNull();

    host.r.loading.set(false);
    host.r.value.set(true);
    await fixture.whenStable();
    expect(el.querySelector('.content')?.textContent).toBe('the runs');
    expect(el.querySelector('mat-progress-bar')).toBeNull();

    host.empty.set(true);
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="runs-empty"]')?.textContent).toContain('No runs yet.');
    expect(el.querySelector('.content')).toBeNull();

    host.r.error.set(new ApiError(404, 'not_found', 'The run was not found.'));
    await fixture.whenStable();
    const error = el.querySelector('[data-testid="runs-error"]')!;
    expect(error.getAttribute('role')).toBe('alert');
    expect(error.textContent).toContain('This run does not exist, or you are not a member');
    expect(error.querySelector('button')?.textContent).toBe('Try again');

    host.r.error.set(new ApiError(500, 'internal', 'The server could not answer.'));
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="runs-error"]')?.textContent).toContain(
      'The server could not answer.',
    );
  });

  it('puts the prefix sentence before the error, a fixed sentence for a static file, and the projected empty content', async () => {
    TestBed.configureTestingModule({ imports: [WordedHost], providers: testProviders() });
    const fixture = TestBed.createComponent(WordedHost);
    const host = fixture.componentInstance;
    const el: HTMLElement = fixture.nativeElement;
    host.r.loading.set(false);
    host.r.value.set(true);
    await fixture.whenStable();
    const empty = el.querySelector('[data-testid="gases-empty"]')!;
    expect(empty.textContent?.trim()).toBe('No gases yet. Define one.');
    expect(empty.textContent).not.toContain('Nothing here yet.');

    host.r.error.set(new ApiError(500, 'internal', 'The server could not answer.'));
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="gases-error"] p')?.textContent?.trim()).toBe(
      'The gases could not be loaded: The server could not answer.',
    );

    host.fixed.set('This page could not be loaded.');
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="gases-error"] p')?.textContent?.trim()).toBe(
      'The gases could not be loaded: This page could not be loaded.',
    );
    host.r.error.set(new ApiError(404, 'not_found', 'Not found.'));
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="gases-error"] p')?.textContent?.trim()).toBe(
      'The gases could not be loaded: This page does not exist.',
    );
  });
});

@Component({
  imports: [AsyncState],
  template: `<tl-async-state
    [resource]="r.resource"
    [empty]="true"
    errorPrefix="The gases could not be loaded:"
    [errorText]="fixed()"
    notFound="This page does not exist."
    testId="gases"
  >
    <span stateEmpty>No gases yet. Define one.</span>
    <p class="content">the gases</p>
  </tl-async-state>`,
})
class WordedHost {
  readonly r = fakeResource();
  readonly fixed = signal<string | null>(null);
}

import { Component } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MatSnackBar } from '@angular/material/snack-bar';
import { provideRouter, Router } from '@angular/router';
import { CARRY_OVER_MS, PageToasts } from './page-toasts';

@Component({ template: 'page' })
class Page {}

describe('PageToasts', () => {
  let snack: MatSnackBar;
  let router: Router;

  beforeEach(() => {
    vi.useFakeTimers({ toFake: ['Date'] });
    TestBed.configureTestingModule({
      providers: [
        provideRouter([
          { path: 'a', component: Page },
          { path: 'b', component: Page },
        ]),
        { provide: MatSnackBar, useClass: PageToasts },
      ],
    });
    snack = TestBed.inject(MatSnackBar);
    router = TestBed.inject(Router);
  });
  afterEach(() => vi.useRealTimers());

  it('dismisses a toast of the page being left', async () => {
    const dismissed = vi.spyOn(snack.open('Saved.', undefined, { duration: 10_000 }), 'dismiss');
    vi.setSystemTime(Date.now() + CARRY_OVER_MS + 1);
    await router.navigateByUrl('/b');
    expect(dismissed).toHaveBeenCalled();
  });

  it('keeps the toast of the action that navigates', async () => {
    const toast = snack.open('Draft deleted.', undefined, { duration: 10_000 });
    const dismissed = vi.spyOn(toast, 'dismiss');
    await router.navigateByUrl('/a');
    expect(dismissed).not.toHaveBeenCalled();
  });
});

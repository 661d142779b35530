import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { testProviders } from '../core/session-testing';
import { HelpPageView } from './help-page';
import { HELP_PAGES } from './help-pages';

const APP_PAGE = '<!doctype html><html><body><tl-root></tl-root></body></html>';

describe('HelpPageView', () => {
  function render(page?: string) {
    TestBed.configureTestingModule({ imports: [HelpPageView], providers: testProviders() });
    const http = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(HelpPageView);
    if (page) fixture.componentRef.setInput('page', page);
    TestBed.tick();
    return { http, fixture, el: fixture.nativeElement as HTMLElement };
  }

  /** Lets the answered look-ups reach the page (the page's own read is still open). */
  async function answered(): Promise<void> {
    for (let i = 0; i < 3; i++) {
      await Promise.resolve();
      TestBed.tick();
    }
  }

  /** Answers the look-up of every candidate page: `shipped` get Markdown, the rest the app's page. */
  function answerDiscovery(http: HttpTestingController, shipped: string[]): void {
    for (const p of HELP_PAGES) {
      for (const req of http.match(`/docs/${p.slug}.md`)) {
        req.flush(shipped.includes(p.slug) ? `# ${p.title}\n` : APP_PAGE);
      }
    }
  }

  it('lists only the shipped pages and shows the first one', async () => {
    const { http, fixture, el } = render();
    expect(
      el.querySelector('mat-progress-bar[aria-label="Finding the guide pages"]'),
    ).not.toBeNull();
    answerDiscovery(http, ['getting-started', 'numeric']);
    await answered();
    const menu = [...el.querySelectorAll('[data-testid^="help-page-"]')].map((a) =>
      a.getAttribute('data-testid'),
    );
    expect(menu).toEqual(['help-page-getting-started', 'help-page-numeric']);
    expect(el.querySelector('mat-progress-bar[aria-label="Loading the page"]')).not.toBeNull();
    http.expectOne('/docs/getting-started.md').flush('# Getting started\n\nSome words.\n');
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="help-article"]')?.textContent).toContain('Some words.');
    http.verify();
  });

  it('says a page does not exist when the server answers with the app instead', async () => {
    const { http, fixture, el } = render('numeric');
    answerDiscovery(http, ['getting-started', 'numeric']);
    await answered();
    http.expectOne('/docs/numeric.md').flush(APP_PAGE);
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="help-error"]')?.textContent).toContain(
      'This guide page does not exist.',
    );
    expect(el.querySelector('[data-testid="help-article"]')).toBeNull();
    http.verify();
  });

  it('says a page could not be loaded when its request fails', async () => {
    const { http, fixture, el } = render();
    answerDiscovery(http, ['getting-started']);
    await answered();
    http
      .expectOne('/docs/getting-started.md')
      .flush('gone', { status: 500, statusText: 'Server Error' });
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="help-error"]')?.textContent).toContain(
      'This guide page could not be loaded.',
    );
    http.verify();
  });

  it('says so when the build shipped no guide page', async () => {
    const { http, fixture, el } = render();
    answerDiscovery(http, []);
    await fixture.whenStable();
    expect(el.querySelector('[data-testid="help-error"]')?.textContent).toContain(
      'No guide pages were shipped with this build.',
    );
    expect(el.querySelector('mat-progress-bar')).toBeNull();
    http.verify();
  });
});

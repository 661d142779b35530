import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import type { Role } from '@traceloom/shared/api';
import { signInAs, testProviders } from '../core/session-testing';
import { GasEditor } from './gas-editor';
import { PREVIEW_DEBOUNCE_MS } from './gas-preview';

const STUDY = '6f1c2d3e-0000-4000-8000-000000000001';

describe('GasEditor', () => {
  let fixture: ComponentFixture<GasEditor>;
  let http: HttpTestingController;
  let el: HTMLElement;

  /**
   * Renders the editor of a new gas in STUDY. The breadcrumb reads the study through a resource,
   * which keeps the fixture from settling until it is answered: answered here unless the test
   * looks at the crumb while it loads (`answerStudy` false; the fixture is then not settled).
   */
  async function render(
    role: Role = 'author',
    keepDrafts = false,
    answerStudy = true,
  ): Promise<void> {
    sessionStorage.clear();
    if (!keepDrafts) localStorage.clear();
    TestBed.configureTestingModule({
      imports: [GasEditor],
      providers: testProviders(),
    });
    http = TestBed.inject(HttpTestingController);
    signInAs(role);
    fixture = TestBed.createComponent(GasEditor);
    fixture.componentRef.setInput('studyId', STUDY);
    el = fixture.nativeElement;
    await Promise.resolve();
    TestBed.tick();
    if (!answerStudy) return;
    http.expectOne(`/api/studies/${STUDY}`).flush({ title: 'Trap study' });
    await settle();
  }

  async function settle(): Promise<void> {
    await Promise.resolve();
    TestBed.tick();
    await fixture.whenStable();
  }

  const input = (id: string) => el.querySelector(`[data-testid="${id}"]`) as HTMLInputElement;

  async function type(id: string, value: string): Promise<void> {
    const field = input(id);
    field.value = value;
    field.dispatchEvent(new Event('input'));
    field.dispatchEvent(new Event('blur'));
    await settle();
  }

  /** The mat-error text inside the form field that holds the given input. */
  function errorUnder(id: string): string {
    const field = input(id).closest('mat-form-field');
    return field?.querySelector('mat-error')?.textContent?.trim() ?? '';
  }

  async function fillHarmonicTrap(): Promise<void> {
    await type('gas-title', 'harmonic trap');
    await type('gas-step', '1/2');
    await type('gas-order', '20');
    await type('gas-formula', 'q^(L/2)/(1-q^L)');
  }

  afterEach(() => {
    vi.useRealTimers();
    // the breadcrumb names the study: answer its request wherever a test did not
    for (const req of http.match((r) => /^\/api\/studies\/[^/]+$/.test(r.url)))
      req.flush({ title: 'Trap study' });
    http.verify();
  });

  it('names the study in the breadcrumb', async () => {
    await render('author', false, false);
    // While the title loads: a quiet bar, no placeholder word.
    const loading = el.querySelector('nav.crumbs')?.textContent ?? '';
    expect(loading).not.toMatch(/\b[Ss]tudy\b/);
    expect(el.querySelector('nav.crumbs .tl-skeleton')).not.toBeNull();
    http.expectOne(`/api/studies/${STUDY}`).flush({ title: 'Trap study' });
    await settle();
    const crumbs = el.querySelector('nav.crumbs')?.textContent ?? '';
    expect(crumbs).toContain('Trap study');
    expect(crumbs).not.toMatch(/\bStudy\b/);
  });

  it('names the field when a required value is missing', async () => {
    await render();
    await type('gas-title', '');
    expect(errorUnder('gas-title')).toBe('The title is required.');
  });

  it('shows the shared schema findings under the field they concern', async () => {
    await render();
    await type('gas-step', '1/2');
    await type('gas-order', '3/4');
    expect(errorUnder('gas-order')).toBe('The order must be a multiple of step.');
    await type('gas-variable', 'e');
    expect(errorUnder('gas-variable')).toBe('The variable e and i are not allowed.');
    await type('gas-nmax', '3');
    await type('gas-classtable', '5');
    expect(errorUnder('gas-classtable')).toBe('The class-table depth must not exceed nMax.');
    await type('gas-formula', '');
    expect(errorUnder('gas-formula')).toBe('The formula must not be empty.');
    // Fixing the value clears the message.
    await type('gas-order', '5/2');
    expect(errorUnder('gas-order')).toBe('');
  });

  it('offers add and remove rows for a list of values, with a message per row', async () => {
    await render();
    (el.querySelector('[data-testid="gas-kind-values"] input') as HTMLInputElement).click();
    await settle();
    expect(input('gas-value-1')).not.toBeNull();
    (el.querySelector('[data-testid="gas-value-add"]') as HTMLButtonElement).click();
    await settle();
    expect(input('gas-value-2')).not.toBeNull();
    await type('gas-value-2', '');
    expect(errorUnder('gas-value-2')).toBe('Z_2 must not be empty.');
    (el.querySelector('[data-testid="gas-value-remove-2"]') as HTMLButtonElement).click();
    await settle();
    expect(input('gas-value-2')).toBeNull();
  });

  it('previews after a pause in typing and cancels a superseded request', async () => {
    vi.useFakeTimers();
    await render();
    await fillHarmonicTrap();
    await vi.advanceTimersByTimeAsync(PREVIEW_DEBOUNCE_MS + 10);
    const first = http.expectOne('/api/compute');
    // The preview asks for little: Z(1..3), no class table, a capped order.
    expect(first.request.body.spec).toMatchObject({
      nMax: 3,
      classTable: 0,
      step: '1/2',
      order: '20',
    });
    await type('gas-order', '30');
    await vi.advanceTimersByTimeAsync(PREVIEW_DEBOUNCE_MS - 100);
    http.expectNone('/api/compute');
    await vi.advanceTimersByTimeAsync(200);
    const second = http.expectOne('/api/compute');
    expect(first.cancelled).toBe(true);
    expect(second.request.body.spec.order).toBe('30');
    second.flush({
      weights: [
        {
          L: 1,
          value: {
            order: '30',
            terms: [
              ['1/2', '1'],
              ['3/2', '1'],
            ],
          },
        },
      ],
      canonical: [
        { N: 0, value: { order: null, terms: [['0', '1']] }, routes: ['recursion'], agrees: true },
        {
          N: 3,
          value: { order: '30', terms: [['9/2', '1']] },
          routes: ['recursion'],
          agrees: true,
        },
      ],
    });
    await settle();
    expect(el.querySelector('[data-testid="preview-z-3"] .katex')).not.toBeNull();
    expect(el.querySelector('[data-testid="preview-z-0"]')).toBeNull();
  });

  it("puts the preview's field error under that field", async () => {
    vi.useFakeTimers();
    await render();
    await fillHarmonicTrap();
    await vi.advanceTimersByTimeAsync(PREVIEW_DEBOUNCE_MS + 10);
    http.expectOne('/api/compute').flush(
      {
        error: {
          code: 'invalid_spec',
          message: 'unknown function sinq',
          field: 'spec.weights.expression',
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(errorUnder('gas-formula')).toBe('The formula unknown function sinq.');
    expect(el.querySelector('[data-testid="preview-error"]')?.textContent).toContain(
      'unknown function sinq',
    );
  });

  it('saves a new gas and opens it; a server field error lands on the field', async () => {
    await render();
    await fillHarmonicTrap();
    const navigate = vi.spyOn(TestBed.inject(Router), 'navigate').mockResolvedValue(true);
    (el.querySelector('[data-testid="gas-save"]') as HTMLButtonElement).click();
    await settle();
    const refused = http.expectOne(`/api/studies/${STUDY}/gases`);
    expect(refused.request.method).toBe('POST');
    expect(refused.request.body.spec).toMatchObject({
      format: 'traceloom.gas/1',
      title: 'harmonic trap',
      statistics: 'fermion',
      step: '1/2',
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
    });
    refused.flush(
      {
        error: {
          code: 'invalid_spec',
          message: 'must be a multiple of step',
          field: 'body.spec.order',
        },
      },
      { status: 400, statusText: 'Bad Request' },
    );
    await settle();
    expect(errorUnder('gas-order')).toBe('The order must be a multiple of step.');
    expect(navigate).not.toHaveBeenCalled();

    await type('gas-order', '40');
    (el.querySelector('[data-testid="gas-save"]') as HTMLButtonElement).click();
    await settle();
    http.expectOne(`/api/studies/${STUDY}/gases`).flush({
      id: 'g1',
      studyId: STUDY,
      title: 'harmonic trap',
      version: 1,
      spec: {},
      versions: [],
      createdAt: '',
      updatedAt: '',
    });
    // The run history is read through a resource, and the fixture is stable only once its
    // request is answered: render, answer the request, then settle.
    await Promise.resolve();
    TestBed.tick();
    // The saved gas shows its (empty) run history at once.
    http.expectOne('/api/gases/g1/runs').flush([]);
    await settle();
    expect(navigate).toHaveBeenCalledWith(['/gases', 'g1'], { state: { showRuns: true } });
    expect(el.querySelector('[data-testid="runs-empty"]')).not.toBeNull();
    http.match('/api/compute').forEach((r) => r.flush({ weights: [], canonical: [] }));
  });

  it('refuses to save while a field has a problem, and says so', async () => {
    await render();
    await type('gas-title', 'broken');
    await type('gas-formula', '');
    (el.querySelector('[data-testid="gas-save"]') as HTMLButtonElement).click();
    await settle();
    http.expectNone(`/api/studies/${STUDY}/gases`);
    expect(el.querySelector('[data-testid="gas-save-error"]')?.textContent).toContain(
      'Some fields need attention',
    );
  });

  it('offers a numeric kernel gas: precision instead of step and order, preview at 10 digits', async () => {
    vi.useFakeTimers();
    await render();
    await type('gas-title', 'line kernel');
    (el.querySelector('[data-testid="gas-numeric"] button') as HTMLButtonElement).click();
    await settle();
    expect(input('gas-step')).toBeNull();
    expect(input('gas-order')).toBeNull();
    // formula gases are evaluated at a number in numeric mode
    expect(input('gas-at').value).toBe('1/10');
    (el.querySelector('[data-testid="gas-kind-kernel"] input') as HTMLInputElement).click();
    await settle();
    expect(input('gas-at')).toBeNull();
    await type('gas-kernel', '1/(2*pi*cosh((x-y)/2))');
    await type('gas-recognize-basis', '1\n1/pi');
    await vi.advanceTimersByTimeAsync(PREVIEW_DEBOUNCE_MS + 10);
    const preview = http.expectOne('/api/compute');
    expect(preview.request.body.spec).toMatchObject({
      precision: 10,
      nMax: 3,
      weights: { kind: 'kernel', expression: '1/(2*pi*cosh((x-y)/2))', from: null, to: null },
    });
    expect(preview.request.body.spec.recognize).toBeUndefined();
    preview.flush({
      weights: [{ L: 1, value: { real: '1.989436789e-2', error: '4e-12' } }],
      canonical: [
        { N: 0, value: { real: '1', error: '0' }, routes: ['recursion'], agrees: true },
        {
          N: 1,
          value: { real: '1.989436789e-2', error: '4e-12' },
          routes: ['recursion'],
          agrees: true,
        },
      ],
    });
    await settle();
    expect(el.querySelector('[data-testid="preview-z-1"] .katex')?.textContent).toContain('±');
    // a periodic kernel needs both ends: the message lands under the empty end
    (el.querySelector('[data-testid="gas-kernel-periodic"] button') as HTMLButtonElement).click();
    await settle();
    input('gas-kernel-from').dispatchEvent(new Event('blur'));
    await settle();
    expect(errorUnder('gas-kernel-from')).toBe(
      'The lower end a periodic kernel needs both ends of its circle.',
    );
  });

  it('is read-only for a reviewer', async () => {
    await render('reviewer');
    expect(el.querySelector('[data-testid="gas-read-only"]')).not.toBeNull();
    expect(el.querySelector('[data-testid="gas-save"]')).toBeNull();
    expect(input('gas-title').disabled).toBe(true);
  });

  it('keeps an unsaved form in the browser and restores it after a reload', async () => {
    await render();
    await type('gas-title', 'draft that survives');
    await type('gas-formula', 'q^L/(1-q^L)');
    http.match('/api/compute').forEach((r) => r.flush({ weights: [], canonical: [] }));
    fixture.destroy();
    TestBed.resetTestingModule();
    await render('author', true); // the same study, as after a reload
    await settle();
    expect(input('gas-title').value).toBe('draft that survives');
    expect(input('gas-formula').value).toBe('q^L/(1-q^L)');
    expect(el.querySelector('[data-testid="gas-draft-restored"]')).not.toBeNull();
    (el.querySelector('[data-testid="gas-draft-discard"]') as HTMLButtonElement).click();
    await settle();
    expect(input('gas-title').value).toBe('');
    expect(Object.keys(localStorage).filter((k) => k.startsWith('traceloom.gas-draft.'))).toEqual(
      [],
    );
    http.match('/api/compute').forEach((r) => r.flush({ weights: [], canonical: [] }));
  });

  it('makes one row per line when several lines are pasted into the values list', async () => {
    await render();
    (el.querySelector('[data-testid="gas-kind-values"] input') as HTMLInputElement).click();
    await settle();
    const paste = new Event('paste', { bubbles: true, cancelable: true });
    Object.defineProperty(paste, 'clipboardData', {
      value: { getData: () => '1/4\nq + 2*q^2 + O(q^5)\r\n\n3*q^3\n' },
    });
    input('gas-value-1').dispatchEvent(paste);
    await settle();
    expect(paste.defaultPrevented).toBe(true);
    expect([1, 2, 3].map((i) => input(`gas-value-${i}`)?.value)).toEqual([
      '1/4',
      'q + 2*q^2 + O(q^5)',
      '3*q^3',
    ]);
    expect(input('gas-value-4')).toBeNull();
    http.match('/api/compute').forEach((r) => r.flush({ weights: [], canonical: [] }));
  });

  it('links every expression field to the syntax page', async () => {
    await render();
    const SYNTAX = '/help/spec#the-expression-language';
    /** The syntax link in the field's own hint, or in the hint line of its group of fields. */
    const linkBeside = (id: string) => {
      const field = input(id);
      expect(field, id).not.toBeNull();
      const own = field.closest('mat-form-field')?.querySelector('tl-syntax-link a');
      const group = field.closest('.grid, fieldset')?.querySelector('p tl-syntax-link a');
      return (own ?? group)?.getAttribute('href');
    };
    const click = async (selector: string) => {
      (el.querySelector(selector) as HTMLElement).click();
      await settle();
    };
    expect(linkBeside('gas-formula')).toBe(SYNTAX);
    await click('[data-testid="gas-kind-values"] input');
    expect(linkBeside('gas-value-1')).toBe(SYNTAX);
    await click('[data-testid="gas-kind-spectrum"] input');
    for (const id of [
      'gas-spectrum',
      'gas-spectrum-offset',
      'gas-spectrum-from',
      'gas-spectrum-to',
    ])
      expect(linkBeside(id), id).toBe(SYNTAX);
    await click('[data-testid="gas-numeric"] button');
    for (const id of ['gas-at', 'gas-recognize-basis']) expect(linkBeside(id), id).toBe(SYNTAX);
    await click('[data-testid="gas-kind-kernel"] input');
    for (const id of ['gas-kernel', 'gas-kernel-from', 'gas-kernel-to'])
      expect(linkBeside(id), id).toBe(SYNTAX);
    await click('[data-testid="gas-grand-expression"] input');
    expect(linkBeside('gas-grand-text')).toBe(SYNTAX);
    await click('[data-testid="gas-grand-coefficients"] input');
    expect(linkBeside('gas-grand-values')).toBe(SYNTAX);
    await click('[data-testid="gas-sectors"] button');
    for (const id of ['gas-sector-weight', 'gas-sector-from-0', 'gas-sector-to-0'])
      expect(linkBeside(id), id).toBe(SYNTAX);
    http.match('/api/compute').forEach((r) => r.flush({ weights: [], canonical: [] }));
    http.match('/api/compute/estimate').forEach((r) => r.flush({}));
  });
});

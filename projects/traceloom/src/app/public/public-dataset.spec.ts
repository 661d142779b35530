import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { testProviders } from '../core/session-testing';
import { PublicDatasetPage } from './public-dataset';

const HASH = 'a'.repeat(64);

/** A document locked before the statuses were named passes / fails. */
const OLD_DOCUMENT = {
  title: 'Trap, first look',
  description: '',
  version: 1,
  lockedAt: '2026-03-01T10:00:00.000Z',
  lockedBy: { displayName: 'Odile Brandvik' },
  createdBy: { displayName: 'Ilse Marenko' },
  study: { title: 'Fermions on a ring' },
  snapshot: {
    spec: {
      format: 'traceloom.gas/1',
      title: 'trap',
      statistics: 'fermion',
      variable: 'q',
      step: '1/2',
      order: '4',
      nMax: 1,
      classTable: 0,
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
    },
    result: {
      canonical: [
        { N: 0, value: { order: null, terms: [['0', '1']] } },
        {
          N: 1,
          value: {
            order: '4',
            terms: [
              ['1/2', '1'],
              ['3/2', '1'],
              ['5/2', '1'],
              ['7/2', '1'],
            ],
          },
        },
      ],
    },
  },
  checks: [
    { check: 'grand', label: 'grand check', N: 0, status: 'green', detail: 'agrees below q^4' },
    { check: 'grand', label: 'grand check', N: 1, status: 'red', detail: 'differs at q^(3/2)' },
  ],
  reviews: [],
};

describe('PublicDatasetPage', () => {
  it('reads an older document: green / red as passes / fails, the gas and what is known', async () => {
    TestBed.configureTestingModule({ imports: [PublicDatasetPage], providers: testProviders() });
    const http = TestBed.inject(HttpTestingController);
    const fixture = TestBed.createComponent(PublicDatasetPage);
    fixture.componentRef.setInput('hash', HASH);
    TestBed.tick();
    http.expectOne(`/api/public/datasets/${HASH}`).flush({
      hash: HASH,
      citation: 'c',
      authors: ['Ines Okafor', 'Tomas Varga'],
      supersededBy: null,
      document: OLD_DOCUMENT,
    });
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    const text = el.textContent ?? '';
    expect(text).not.toMatch(/\bgreen\b|\bred\b/);
    const statuses = [...el.querySelectorAll('section[aria-labelledby="checks"] tbody tr')].map(
      (r) => r.querySelectorAll('td')[2]?.textContent?.trim(),
    );
    expect(statuses).toEqual(['passes', 'fails']);
    expect(el.querySelector('[data-testid="public-known"]')?.textContent).toContain(
      '2 of 2 rows determined',
    );
    expect(el.querySelector('[data-testid="public-known"]')?.textContent).toContain(
      'checks: 1 passes, 1 fails, 0 waived of 2',
    );
    expect(el.querySelector('[data-testid="public-definition"]')?.textContent).toContain(
      'Z_L = q^(L/2)/(1-q^L)',
    );
    expect(el.querySelector('[data-testid="public-authors"]')?.textContent).toContain(
      'Authors: Ines Okafor, Tomas Varga',
    );
    http.verify();
  });
});

import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import type { ReviewInboxEntryDto } from '@traceloom/shared/api';
import { signInAs, testProviders } from '../core/session-testing';
import { ReviewInbox } from './review-inbox';

function entry(
  title: string,
  state: 'in_review' | 'locked',
  myVerdict: 'approve' | null,
): ReviewInboxEntryDto {
  return {
    dataset: {
      id: `7b000000-0000-4000-8000-00000000000${title.length % 10}`,
      studyId: 's',
      runId: 'r',
      title,
      version: 1,
      state,
      hash: null,
      lockedAt: null,
      supersedes: null,
      supersededBy: null,
      createdBy: { id: 'a', displayName: 'Ines Okafor' },
      createdAt: '2026-03-01T10:00:00.000Z',
      updatedAt: '2026-03-01T10:00:00.000Z',
      approved: false,
      readyToLock: false,
    },
    requestedBy: { id: 'a', displayName: 'Ines Okafor' },
    requestedAt: '2026-03-01T10:00:00.000Z',
    myVerdict,
  };
}

describe('ReviewInbox', () => {
  it('puts requests still waiting for a verdict first and counts them', async () => {
    sessionStorage.clear();
    TestBed.configureTestingModule({ imports: [ReviewInbox], providers: testProviders() });
    const http = TestBed.inject(HttpTestingController);
    signInAs('reviewer');
    const fixture = TestBed.createComponent(ReviewInbox);
    TestBed.tick();
    http
      .expectOne('/api/review-requests')
      .flush([entry('Done one', 'locked', 'approve'), entry('Waiting one', 'in_review', null)]);
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    const rows = [...el.querySelectorAll('[data-testid="inbox-row"]')].map(
      (r) => r.textContent ?? '',
    );
    expect(rows[0]).toContain('Waiting one');
    expect(rows[1]).toContain('you approved');
    expect(el.querySelector('[data-testid="inbox-summary"]')?.textContent).toContain('1 waiting');
    http.verify();
  });
});

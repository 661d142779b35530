import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { DirectoryEntryDto, StudyDto } from '@traceloom/shared/api';
import { StudyMembers } from './study-members';

const OWNER = { id: 'u-owner', displayName: 'Noor Halloran', email: 'noor@example.test' };
const ILSE: DirectoryEntryDto = {
  id: 'u-ilse',
  displayName: 'Ilse Varga',
  email: 'ilse@example.test',
  role: 'reviewer',
};
const KAI: DirectoryEntryDto = {
  id: 'u-kai',
  displayName: 'Kai Lindqvist',
  email: 'kai@example.test',
  role: 'steward',
};
const STUDY: StudyDto = {
  id: 'study-1',
  title: 'Fermions on a ring',
  description: '',
  owner: OWNER,
  members: [ILSE],
  createdAt: '2026-02-01T10:00:00.000Z',
  updatedAt: '2026-02-01T10:00:00.000Z',
  memberCount: 2,
  lastChangeAt: '2026-02-01T10:00:00.000Z',
};
import { testProviders } from '../core/session-testing';

describe('StudyMembers', () => {
  let fixture: ComponentFixture<StudyMembers>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;
  let emitted: StudyDto[];

  function render(canManage: boolean): void {
    TestBed.configureTestingModule({
      imports: [StudyMembers],
      providers: testProviders(),
    });
    httpTesting = TestBed.inject(HttpTestingController);
    fixture = TestBed.createComponent(StudyMembers);
    fixture.componentRef.setInput('study', STUDY);
    fixture.componentRef.setInput('canManage', canManage);
    emitted = [];
    fixture.componentInstance.changed.subscribe((s) => emitted.push(s));
    el = fixture.nativeElement;
    TestBed.tick();
  }

  const all = (id: string) => [...el.querySelectorAll(`[data-testid="${id}"]`)];
  const one = <T extends Element>(id: string) => el.querySelector(`[data-testid="${id}"]`) as T;

  afterEach(() => httpTesting.verify());

  /** Opens the Material member picker; its options (rendered in the overlay). */
  async function openPicker(): Promise<HTMLElement[]> {
    one<HTMLElement>('member-select')
      .querySelector<HTMLElement>('.mat-mdc-select-trigger')!
      .click();
    await fixture.whenStable();
    return [...document.querySelectorAll<HTMLElement>('[data-testid="member-option"]')];
  }

  it('offers only people who are neither owner nor member', async () => {
    render(true);
    httpTesting.expectOne('/api/users/directory').flush([{ ...OWNER, role: 'author' }, ILSE, KAI]);
    await fixture.whenStable();
    const options = await openPicker();
    expect(options.map((o) => o.textContent)).toEqual([expect.stringContaining('Kai')]);
    expect(all('member-row').map((r) => r.textContent)).toEqual([
      expect.stringContaining('Ilse Varga'),
    ]);
  });

  it('adds the chosen person and passes the updated study on', async () => {
    render(true);
    httpTesting.expectOne('/api/users/directory').flush([ILSE, KAI]);
    await fixture.whenStable();
    (await openPicker())[0]!.click();
    await fixture.whenStable();
    one<HTMLButtonElement>('member-add').click();
    const req = httpTesting.expectOne('/api/studies/study-1/members');
    expect(req.request.method).toBe('POST');
    expect(req.request.body).toEqual({ userId: KAI.id });
    const updated = { ...STUDY, members: [ILSE, KAI] };
    req.flush(updated, { status: 201, statusText: 'Created' });
    await fixture.whenStable();
    expect(emitted).toEqual([updated]);
  });

  it('asks for a choice instead of sending an empty one', async () => {
    render(true);
    httpTesting.expectOne('/api/users/directory').flush([KAI]);
    await fixture.whenStable();
    one<HTMLButtonElement>('member-add').click();
    await fixture.whenStable();
    expect(one('member-error').textContent).toContain('Choose a person to add.');
    httpTesting.expectNone('/api/studies/study-1/members');
  });

  it("removes a member and shows the server's refusal when there is one", async () => {
    render(true);
    httpTesting.expectOne('/api/users/directory').flush([]);
    await fixture.whenStable();
    one<HTMLButtonElement>('member-remove').click();
    const req = httpTesting.expectOne('/api/studies/study-1/members/u-ilse');
    expect(req.request.method).toBe('DELETE');
    req.flush(
      { error: { code: 'forbidden', message: 'Only the owner or an admin may change members.' } },
      { status: 403, statusText: 'Forbidden' },
    );
    await fixture.whenStable();
    expect(one('member-error').textContent).toContain(
      'Only the owner or an admin may change members.',
    );
    expect(emitted).toEqual([]);
  });

  it('says so when the directory cannot be loaded, and still lists the members', async () => {
    render(true);
    httpTesting
      .expectOne('/api/users/directory')
      .flush(
        { error: { code: 'internal', message: 'The directory is resting.' } },
        { status: 500, statusText: 'Server Error' },
      );
    await fixture.whenStable();
    expect(el.textContent).toContain(
      'The directory could not be loaded: The directory is resting.',
    );
    expect(all('member-row').length).toBe(1);
  });

  it('shows members read-only, without loading the directory, to those who may not manage', async () => {
    render(false);
    await fixture.whenStable();
    httpTesting.expectNone('/api/users/directory');
    expect(all('member-row').length).toBe(1);
    expect(one('member-select')).toBeNull();
    expect(one('member-remove')).toBeNull();
  });
});

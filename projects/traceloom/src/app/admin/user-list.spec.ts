import { HttpTestingController } from '@angular/common/http/testing';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { UserDto } from '@traceloom/shared/api';
import { signInAs, testProviders, testUser } from '../core/session-testing';
import { UserList } from './user-list';

describe('UserList', () => {
  let fixture: ComponentFixture<UserList>;
  let httpTesting: HttpTestingController;
  let el: HTMLElement;
  let me: UserDto;
  const author = testUser('author', { id: 'u-author', displayName: 'Ilse Varga' });

  async function render(users: () => UserDto[]): Promise<void> {
    sessionStorage.clear();
    TestBed.configureTestingModule({
      imports: [UserList],
      providers: testProviders(),
    });
    httpTesting = TestBed.inject(HttpTestingController);
    me = signInAs('admin');
    fixture = TestBed.createComponent(UserList);
    el = fixture.nativeElement;
    TestBed.tick();
    httpTesting.expectOne('/api/users').flush(users());
    await fixture.whenStable();
  }

  const rows = () => [...el.querySelectorAll('[data-testid="user-row"]')];

  afterEach(() => httpTesting.verify());

  it('lists every user with role and status in words; no self-disable', async () => {
    await render(() => [me, author]);
    expect(rows().length).toBe(2);
    const [mine, theirs] = rows();
    expect(mine.textContent).toContain('(you)');
    expect(mine.querySelector('[data-testid="user-toggle-disabled"]')).toBeNull();
    expect((mine.querySelector('select') as HTMLSelectElement).disabled).toBe(true);
    expect(theirs.querySelector('[data-testid="user-status"]')?.textContent?.trim()).toContain(
      'Active',
    );
    expect((theirs.querySelector('select') as HTMLSelectElement).value).toBe('author');
  });

  it('changes a role through PATCH and shows the answer', async () => {
    await render(() => [me, author]);
    const select = rows()[1].querySelector('select') as HTMLSelectElement;
    select.value = 'steward';
    select.dispatchEvent(new Event('change'));
    const req = httpTesting.expectOne('/api/users/u-author');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ role: 'steward' });
    req.flush({ ...author, role: 'steward' });
    await fixture.whenStable();
    expect((rows()[1].querySelector('select') as HTMLSelectElement).value).toBe('steward');
  });

  it('disables an account and then offers to enable it', async () => {
    await render(() => [me, author]);
    (rows()[1].querySelector('[data-testid="user-toggle-disabled"]') as HTMLButtonElement).click();
    const req = httpTesting.expectOne('/api/users/u-author');
    expect(req.request.body).toEqual({ disabled: true });
    req.flush({ ...author, disabled: true });
    await fixture.whenStable();
    expect(rows()[1].querySelector('[data-testid="user-status"]')?.textContent).toContain(
      'Disabled',
    );
    expect(
      rows()[1].querySelector('[data-testid="user-toggle-disabled"]')?.textContent?.trim(),
    ).toBe('Enable');
  });

  it('keeps the old role on screen when the server refuses', async () => {
    await render(() => [me, author]);
    const select = rows()[1].querySelector('select') as HTMLSelectElement;
    select.value = 'admin';
    select.dispatchEvent(new Event('change'));
    httpTesting
      .expectOne('/api/users/u-author')
      .flush(
        { error: { code: 'forbidden', message: 'Not allowed.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    expect((rows()[1].querySelector('select') as HTMLSelectElement).value).toBe('author');
  });
});

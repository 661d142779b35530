import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { ComponentFixture, TestBed } from '@angular/core/testing';
import { MatSelectHarness } from '@angular/material/select/testing';
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
  /** The Material role select of row `i`. */
  const roleSelect = async (i: number) =>
    (await TestbedHarnessEnvironment.loader(fixture).getAllHarnesses(MatSelectHarness))[i]!;

  afterEach(() => httpTesting.verify());

  it('lists every user with role and status in words; no self-disable', async () => {
    await render(() => [me, author]);
    expect(rows().length).toBe(2);
    const [mine, theirs] = rows();
    expect(mine.textContent).toContain('(you)');
    expect(mine.querySelector('[data-testid="user-toggle-disabled"]')).toBeNull();
    expect(el.querySelector('select')).toBeNull(); // Material selects only
    expect(await (await roleSelect(0)).isDisabled()).toBe(true);
    expect(theirs.querySelector('[data-testid="user-status"]')?.textContent?.trim()).toContain(
      'Active',
    );
    expect(await (await roleSelect(1)).getValueText()).toBe('Author');
  });

  it('shows "Invited" for an account that has not accepted its invitation yet', async () => {
    const invited = testUser('reviewer', {
      id: 'u-new',
      displayName: 'Noor Haddad',
      invited: true,
    });
    await render(() => [me, author, invited]);
    const status = (i: number) =>
      rows()[i]!.querySelector('[data-testid="user-status"]')?.textContent?.trim();
    expect(status(2)).toContain('Invited');
    expect(status(2)).not.toContain('Active');
    expect(status(1)).toContain('Active');
  });

  it('changes a role through PATCH and shows the answer', async () => {
    await render(() => [me, author]);
    const select = await roleSelect(1);
    await select.open();
    await select.clickOptions({ text: 'Steward' });
    const req = httpTesting.expectOne('/api/users/u-author');
    expect(req.request.method).toBe('PATCH');
    expect(req.request.body).toEqual({ role: 'steward' });
    req.flush({ ...author, role: 'steward' });
    await fixture.whenStable();
    expect(await (await roleSelect(1)).getValueText()).toBe('Steward');
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
    const select = await roleSelect(1);
    await select.open();
    await select.clickOptions({ text: 'Admin' });
    httpTesting
      .expectOne('/api/users/u-author')
      .flush(
        { error: { code: 'forbidden', message: 'Not allowed.' } },
        { status: 403, statusText: 'Forbidden' },
      );
    await fixture.whenStable();
    expect(await (await roleSelect(1)).getValueText()).toBe('Author');
  });

  it('sends an invited person the invitation again; active people get no such button', async () => {
    const invited = testUser('reviewer', {
      id: 'u-new',
      displayName: 'Noor Haddad',
      invited: true,
    });
    await render(() => [me, author, invited]);
    expect(rows()[1]!.querySelector('[data-testid="user-resend-invitation"]')).toBeNull();
    const resend = rows()[2]!.querySelector<HTMLButtonElement>(
      '[data-testid="user-resend-invitation"]',
    )!;
    resend.click();
    const req = httpTesting.expectOne('/api/users/u-new/invitations');
    expect(req.request.method).toBe('POST');
    req.flush({ invitation: { id: 'i-1', email: 'noor@example.test' } });
    await fixture.whenStable();
    expect(document.body.textContent).toContain('Invitation sent again to noor@example.test.');
  });
});

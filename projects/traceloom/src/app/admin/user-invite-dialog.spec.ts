import { HttpTestingController } from '@angular/common/http/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { TestBed } from '@angular/core/testing';
import { MatDialogRef } from '@angular/material/dialog';
import { MatSelectHarness } from '@angular/material/select/testing';
import { signInAs, testProviders } from '../core/session-testing';
import { UserInviteDialog } from './user-invite-dialog';

describe('UserInviteDialog', () => {
  it('picks the role in a Material select (no native select) and sends it', async () => {
    sessionStorage.clear();
    const close = vi.fn();
    TestBed.configureTestingModule({
      imports: [UserInviteDialog],
      providers: [...testProviders(), { provide: MatDialogRef, useValue: { close } }],
    });
    const http = TestBed.inject(HttpTestingController);
    signInAs('admin');
    const fixture = TestBed.createComponent(UserInviteDialog);
    const el: HTMLElement = fixture.nativeElement;
    await fixture.whenStable();
    expect(el.querySelector('select')).toBeNull();
    const fill = (id: string, value: string) => {
      const input = el.querySelector(`[data-testid="${id}"]`) as HTMLInputElement;
      input.value = value;
      input.dispatchEvent(new Event('input'));
    };
    fill('invite-email', 'noor@example.test');
    fill('invite-display-name', 'Noor Saleh');
    const role = await TestbedHarnessEnvironment.loader(fixture).getHarness(MatSelectHarness);
    expect(await role.getValueText()).toBe('Author');
    await role.open();
    const labels = await Promise.all((await role.getOptions()).map((o) => o.getText()));
    expect(labels).toEqual(['Author', 'Reviewer', 'Steward', 'Admin']);
    await role.clickOptions({ text: 'Reviewer' });
    (el.querySelector('[data-testid="invite-send"]') as HTMLButtonElement).click();
    const req = http.expectOne('/api/users');
    expect(req.request.body).toEqual({
      email: 'noor@example.test',
      displayName: 'Noor Saleh',
      role: 'reviewer',
    });
    req.flush({ user: { id: 'u1' } });
    expect(close).toHaveBeenCalled();
    http.verify();
  });
});

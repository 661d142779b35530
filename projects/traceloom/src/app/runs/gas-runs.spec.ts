import { HttpTestingController } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { signInAs, testProviders } from '../core/session-testing';
import { GasRuns } from './gas-runs';

const GAS = '6f1c2d3e-0000-4000-8000-0000000000a1';
const RUN = '6f1c2d3e-0000-4000-8000-0000000000b2';

describe('GasRuns', () => {
  it('opens the started run on its own page, handing it the warnings of the start', async () => {
    sessionStorage.clear();
    TestBed.configureTestingModule({ imports: [GasRuns], providers: testProviders() });
    const http = TestBed.inject(HttpTestingController);
    const router = TestBed.inject(Router);
    const navigate = vi.spyOn(router, 'navigate').mockResolvedValue(true);
    signInAs('author');
    const fixture = TestBed.createComponent(GasRuns);
    fixture.componentRef.setInput('gasId', GAS);
    fixture.componentRef.setInput('latestVersion', 2);
    fixture.componentRef.setInput('canRun', true);
    TestBed.tick();
    http.expectOne(`/api/gases/${GAS}/runs`).flush([]);
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    const button = el.querySelector('[data-testid="run-start"]') as HTMLButtonElement;
    expect(button.textContent).toContain('Run version 2');
    button.click();
    const start = http.expectOne(`/api/gases/${GAS}/runs`);
    expect(start.request.method).toBe('POST');
    const warning = 'N = 29..40 will not be determined at O(q^200).';
    start.flush({ id: RUN, status: 'queued', warnings: [warning] });
    await fixture.whenStable();
    expect(navigate).toHaveBeenCalledWith(['/runs', RUN], {
      state: { startWarnings: [warning] },
    });
    http.verify();
  });
});

import { TestBed } from '@angular/core/testing';
import type { GasSpecInput } from '@traceloom/shared/engine';
import { testProviders } from '../core/session-testing';
import { controlPathFor, fillGasForm, gasForm, specFromForm } from './gas-form';
import { GasSectorsFields } from './gas-sectors-fields';
import { specProblems } from './gas-validation';

// A two-node quiver written as a 1-index sector sum of spectra (invented scenario of our own).
const QUIVER: GasSpecInput = {
  format: 'traceloom.gas/1',
  title: 'two-node quiver',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '8',
  nMax: 4,
  classTable: 0,
  weights: {
    kind: 'spectrum',
    expression: 'q^((abs(p) + abs(p + n))/2)',
    offset: '0',
    from: null,
    to: null,
  },
  sectors: { index: ['n'], from: [null], to: [null], weight: '1' },
};

describe('the Sectors section of the gas form', () => {
  it('round-trips sector specs (one unbounded index; two indices with bounds)', () => {
    const two: GasSpecInput = {
      ...QUIVER,
      sectors: { index: ['n', 'm'], from: [-3, null], to: [3, 5], weight: '(-1)^(n+m)' },
    };
    for (const spec of [QUIVER, two]) {
      const form = gasForm();
      fillGasForm(form, spec);
      expect(specFromForm(form.getRawValue())).toEqual(spec);
    }
  });

  it('sends no sectors while the section is off, and an empty end as unbounded', () => {
    const form = gasForm();
    fillGasForm(form, { ...QUIVER, sectors: undefined });
    expect(specFromForm(form.getRawValue()).sectors).toBeUndefined();
    form.controls.sectors.controls.enabled.setValue(true);
    form.controls.sectors.controls.indices.at(0).controls.from.setValue(' -2 ');
    expect(specFromForm(form.getRawValue()).sectors).toEqual({
      index: ['n'],
      from: [-2],
      to: [null],
      weight: '1',
    });
  });

  it.each([
    ['sectors.index.1', 'sectors.indices.1.name'],
    ['body.spec.sectors.from.0', 'sectors.indices.0.from'],
    ['sectors.to.2', 'sectors.indices.2.to'],
    ['sectors.weight', 'sectors.weight'],
    ['sectors', 'sectors.weight'],
  ])('puts a problem with %s under %s', (field, control) => {
    expect(controlPathFor(field, 'spectrum')).toBe(control);
  });

  it('the shared schema names a clashing index name and a range end that is not an integer', () => {
    const form = gasForm();
    fillGasForm(form, QUIVER);
    form.controls.sectors.controls.indices.at(0).controls.name.setValue('kappa');
    let problems = specProblems(specFromForm(form.getRawValue()), 'spectrum');
    expect(problems.byControl.get('sectors.indices.0.name')).toMatch(/kappa already has a meaning/);
    form.controls.sectors.controls.indices.at(0).controls.name.setValue('n');
    form.controls.sectors.controls.indices.at(0).controls.to.setValue('two');
    problems = specProblems(specFromForm(form.getRawValue()), 'spectrum');
    expect(problems.byControl.get('sectors.indices.0.to')).toMatch(/integer/);
  });

  it('adds indices up to three with fresh names and removes them', async () => {
    TestBed.configureTestingModule({ imports: [GasSectorsFields], providers: testProviders() });
    const fixture = TestBed.createComponent(GasSectorsFields);
    const form = gasForm();
    form.controls.sectors.controls.enabled.setValue(true);
    fixture.componentRef.setInput('form', form);
    await fixture.whenStable();
    const el: HTMLElement = fixture.nativeElement;
    const add = () => el.querySelector<HTMLButtonElement>('[data-testid="gas-sector-add"]');
    add()!.click();
    await fixture.whenStable();
    add()!.click();
    await fixture.whenStable();
    expect(form.controls.sectors.getRawValue().indices.map((i) => i.name)).toEqual(['n', 'm', 'k']);
    expect(add()).toBeNull();
    el.querySelector<HTMLButtonElement>('[data-testid="gas-sector-remove-1"]')!.click();
    await fixture.whenStable();
    expect(form.controls.sectors.getRawValue().indices.map((i) => i.name)).toEqual(['n', 'k']);
    expect(el.querySelector('[data-testid="gas-sector-weight"]')).not.toBeNull();
  });
});

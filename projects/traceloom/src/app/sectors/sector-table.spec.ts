import { ComponentFixture, TestBed } from '@angular/core/testing';
import type { SectorsJson } from '@traceloom/shared/engine';
import { testProviders } from '../core/session-testing';
import { rowsText, sectorExport, sectorLines, sortSectorLines } from './sector-rows';
import { SectorTable } from './sector-table';

/** A breakdown of `count` sectors n = 0, 1, -1, 2, -2, ... with valuations |n|/2 + N - 1. */
function block(count: number, nMax = 3): SectorsJson {
  const rows = Array.from({ length: count }, (_, i) => {
    const n = i === 0 ? 0 : i % 2 ? (i + 1) / 2 : -i / 2;
    const v = Array.from({ length: nMax }, (_, k) => {
      const twice = Math.abs(n) + 2 * k;
      return twice >= 12 ? null : twice % 2 ? `${twice}/2` : String(twice / 2);
    });
    return {
      index: [n],
      weight: { order: null, terms: [['0', '1']] as [string, string][] },
      valuations: v,
      magnitudes: [],
      contributes: v.map((x) => x !== null),
      contributed: v.some((x) => x !== null),
    };
  });
  return {
    index: ['n'],
    count,
    contributing: rows.filter((r) => r.contributed).length,
    truncated: true,
    rule: 'stopped after 3 quiet shells',
    convention: 'Z(0) = 1 by convention in sector mode',
    rows,
  };
}

describe('sector rows', () => {
  it.each([
    [[true, true, true], '1–3'],
    [[false, true, false, true], '2, 4'],
    [[true, true], '1, 2'],
    [[false], 'none'],
  ])('rowsText(%j) = %s', (c, text) => {
    expect(rowsText(c)).toBe(text);
  });

  it('sorts by index, by the exponent at one N (undetermined last either way) and back', () => {
    const lines = sectorLines(block(13), 'q');
    expect(sortSectorLines(lines, 'index', false).map((l) => l.index[0])).toEqual([
      -6, -5, -4, -3, -2, -1, 0, 1, 2, 3, 4, 5, 6,
    ]);
    const byN3 = sortSectorLines(lines, 'v3', true);
    // at N = 3 the exponent is |n|/2 + 2: below 6 only for |n| < 8 ... all known here except none;
    // descending puts the largest known exponent first and keeps undetermined ones last
    expect(byN3[0]!.cells[2]).toBe('5');
    const byN1 = sortSectorLines(lines, 'v1', false);
    expect(byN1[0]!.index[0]).toBe(0);
    const wide = sectorLines(block(31), 'q');
    const desc = sortSectorLines(wide, 'v1', true);
    expect(desc[desc.length - 1]!.levels[0]).toBeNull();
    expect(desc[0]!.levels[0]).not.toBeNull();
  });

  it('exports one line per sector with a column per N', () => {
    const b = block(3);
    const t = sectorExport(b, sectorLines(b, 'q'));
    expect(t.columns).toEqual([
      'n',
      'weight',
      'lowest exponent N=1',
      'lowest exponent N=2',
      'lowest exponent N=3',
      'contributed',
    ]);
    expect(t.rows[1]).toEqual(['1', '1', '1/2', '3/2', '5/2', 'yes (rows 1–3)']);
  });
});

describe('SectorTable', () => {
  let fixture: ComponentFixture<SectorTable>;
  let el: HTMLElement;

  async function render(b: SectorsJson): Promise<void> {
    TestBed.configureTestingModule({ imports: [SectorTable], providers: testProviders() });
    fixture = TestBed.createComponent(SectorTable);
    fixture.componentRef.setInput('block', b);
    el = fixture.nativeElement;
    await fixture.whenStable();
    await new Promise((r) => setTimeout(r, 50));
    await fixture.whenStable();
  }
  const text = (id: string) => el.querySelector(`[data-testid="${id}"]`)?.textContent ?? '';

  it('shows counts, the rule and the convention, one row per sector', async () => {
    await render(block(5));
    expect(text('sectors-count')).toContain('5 sectors computed, 5 contributed');
    expect(text('sectors-count')).toContain('cut off by the stopping rule');
    expect(text('sectors-rule')).toContain('quiet shells');
    expect(text('sectors-convention')).toContain('Z(0) = 1 by convention');
    expect(text('sector-index-2')).toContain('1');
    expect(text('sector-v-2-1')).toContain('1/2');
    expect(text('sector-contributed-2')).toContain('rows 1–3');
    expect(el.querySelector('[data-testid="sectors-export-csv"]')).not.toBeNull();
  });

  it('renders only the rows in view for thousands of sectors', async () => {
    await render(block(3000));
    const rendered = el.querySelectorAll('[data-testid^="sector-row-"]').length;
    expect(rendered).toBeGreaterThan(0);
    expect(rendered).toBeLessThan(200);
  });

  it('sorts when a header is clicked', async () => {
    await render(block(7));
    const header = [...el.querySelectorAll('th')].find((th) => th.textContent?.trim() === 'n');
    const first = () => el.querySelector('[data-testid^="sector-index-"]')!.textContent!.trim();
    expect(first()).toBe('0'); // enumeration order: 0, 1, -1, 2, ...
    header!.click();
    await fixture.whenStable();
    expect(first()).toBe('-3');
    header!.click();
    await fixture.whenStable();
    expect(first()).toBe('3');
  });
});

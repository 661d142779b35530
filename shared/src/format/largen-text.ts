import type { LargeNClassJson, LargeNJson } from '../engine/largen/types.js';
import type { ValueJson } from '../engine/series/format.js';

const list = (ns: readonly number[]): string => (ns.length ? ns.join(', ') : 'none');

/** Lines of one class: normalization, limit with product form, walls, per-row table. */
function classLines(c: LargeNClassJson, v: string, text: (v: ValueJson) => string): string[] {
  const out: string[] = [];
  const lead = c.normalizationDetail.leadingExponent;
  out.push(`class ${c.parity} N (rows ${list(c.rows)})`);
  out.push(
    `  normalization  ${c.normalization}` +
      (lead
        ? `  (leading exponent ${lead.expression}: fitted on ${list(lead.fittedOn)}, verified on ${list(lead.verifiedOn)})`
        : '  (given)'),
  );
  out.push(`  Z(inf)         ${c.limit ? text(c.limit) : 'not determined'}`);
  out.push(`                 ${c.limitNote}`);
  if (c.product) {
    const shown = c.product.exponents.slice(0, 12).map((e) => `a(${e.n})=${e.a}`);
    const more = c.product.exponents.length > 12 ? ' ...' : '';
    out.push(
      `  product        prod (1 - ${v}^n)^(-a_n), a_n for n < ${c.product.determinedBelow}: ${shown.join(' ')}${more}`,
    );
    out.push(`                 ${c.product.pattern ?? 'no pattern'} — ${c.product.patternNote}`);
  }
  out.push(`  stabilization  ${c.stabilizationFit ?? 'no law found'} — ${c.stabilizationNote}`);
  for (const k of c.corrections) {
    out.push(
      k.status === 'found'
        ? `  correction ${k.m}   ${k.coefficient} * ${v}^(${k.exponent})  fitted on ${list(k.fittedOn)}, verified on ${list(k.verifiedOn)}${k.note ? ` (${k.note})` : ''}`
        : `  correction ${k.m}   not found: ${k.note ?? ''}`,
    );
  }
  const rows = c.stabilization.map((s, i) => {
    const agree = s.agreesBelow ?? (s.atLeast ? `>= ${s.atLeast}` : 'everywhere');
    const corr = c.correctionTerms[i];
    return [String(s.N), agree, corr ? text(corr.value) : ''];
  });
  const head = ['N', 'agrees below', 'Z(N)/Z(inf) - 1'];
  const w = [0, 1].map((j) => Math.max(head[j]!.length, ...rows.map((r) => r[j]!.length)));
  const fmt = (r: string[]): string => `  ${r[0]!.padEnd(w[0]!)}  ${r[1]!.padEnd(w[1]!)}  ${r[2]}`;
  out.push('', fmt(head));
  for (const r of rows) out.push(fmt(r));
  return out;
}

/**
 * The large-N summary of a result as plain-text lines for `--format table`: per class the
 * normalization, Z(inf) with its product exponents, the stabilization law, the correction walls
 * with the rows that verify them, and a row table N x (agrees below, first corrections). Starts
 * with a blank separator line; no lines when the block holds no series analysis.
 */
export function largeNTableLines(
  block: Partial<LargeNJson> | undefined,
  text: (v: ValueJson) => string,
): string[] {
  if (!block?.classes) return [];
  const out: string[] = ['', 'large N'];
  for (const n of block.notes ?? []) out.push(`  note: ${n}`);
  for (const c of block.classes) out.push(...classLines(c, block.variable ?? 'q', text));
  return out;
}

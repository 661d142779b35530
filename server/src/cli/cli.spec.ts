import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdtempSync, rmSync, utimesSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { classRowJsonText as classRowText } from '@traceloom/shared';
import { csvCell } from '@traceloom/shared/format';

// Runs the command line as `npm run cli` does: scripts/cli.mjs loading the bundle that
// `npm run build:server` writes (npm test builds first; locally: npm run build:shared && npm run build:server).
const root = fileURLToPath(new URL('../../../', import.meta.url));
const entry = `${root}scripts/cli.mjs`;
const bundle = `${root}dist/cli/traceloom.mjs`;

function run(args: string[], input?: string, env: NodeJS.ProcessEnv = process.env) {
  if (!existsSync(bundle)) throw new Error(`build the CLI first: ${bundle} is missing`);
  const r = spawnSync(process.execPath, [entry, ...args], {
    input,
    encoding: 'utf8',
    cwd: root,
    env,
  });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

const trap = JSON.stringify({
  format: 'traceloom.gas/1',
  statistics: 'fermion',
  variable: 'q',
  step: '1/2',
  order: '8',
  nMax: 4,
  classTable: 4,
  weights: { kind: 'formula', expression: 'q^(L/2) / (1 - q^L)' },
});

function numericSpec(): string {
  return JSON.stringify({
    format: 'traceloom.gas/1',
    statistics: 'fermion',
    precision: 20,
    at: { q: '1/10' },
    nMax: 2,
    weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
  });
}

describe('traceloom compute', () => {
  it('says in one line what to build when the bundle is missing (a fresh clone), exit 2', () => {
    const r = run(['compute', '-'], trap, {
      ...process.env,
      TRACELOOM_CLI_BUNDLE: `${root}dist/none.mjs`,
    });
    expect(r.code).toBe(2);
    expect(r.out).toBe('');
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).toMatch(/not built yet; run `npm run build:shared && npm run build:server`/);
  });

  it('runs the same when the bundle no longer matches the hash recorded at build time (the loader hashes it itself)', () => {
    const copy = mkdtempSync(path.join(tmpdir(), 'traceloom-cli-'));
    try {
      cpSync(path.dirname(bundle), copy, { recursive: true });
      // a new modification time: traceloom.key.json no longer describes the bundle
      utimesSync(path.join(copy, 'traceloom.cjs'), new Date(), new Date(Date.now() + 5000));
      const moved = run(['compute', '-'], trap, {
        ...process.env,
        TRACELOOM_CLI_BUNDLE: path.join(copy, 'traceloom.mjs'),
      });
      const here = run(['compute', '-'], trap);
      expect(moved.code).toBe(0);
      expect(moved.err).toBe('');
      const strip = (text: string) => ({ ...JSON.parse(text), timings: null });
      expect(strip(moved.out)).toEqual(strip(here.out));
    } finally {
      rmSync(copy, { recursive: true, force: true });
    }
  });

  it('prints the result JSON with the class rows streamed (p(1)+...+p(4) = 1+2+3+5 rows, OEIS A000041)', () => {
    const r = run(['compute', '-'], trap);
    expect(r.code).toBe(0);
    const result = JSON.parse(r.out);
    expect(result.format).toBe('traceloom.result/1');
    expect(result.classes).toHaveLength(11);
    // Z(2) = q^2/((1-q)(1-q^2)) = q^2 + q^3 + 2q^4 + ... (Andrews 1976 Cor. 2.2)
    expect(result.canonical[2].value.terms.slice(0, 3)).toEqual([
      ['2', '1'],
      ['3', '1'],
      ['4', '2'],
    ]);
    expect(result.methods.classSum).toEqual({ nMax: 4, agrees: true });
  });

  it.each([
    ['table', /N\s+routes\s+route check\s+Z\(N\)/],
    [
      'csv',
      /^N,Z\(N\),lowest exponent,terms,known to,routes,route check\n0,1,0,1,exact,recursion\+classSum,agrees/,
    ],
    ['latex', /\\begin\{align\*\}[\s\S]*\\begin\{longtable\}\{rlrrl\}/],
  ])('--format %s', (format, pattern) => {
    const r = run(['compute', '-', '--format', format], trap);
    expect(r.code).toBe(0);
    expect(r.out).toMatch(pattern);
  });

  it.each([
    [['compute', '-'], '{"format": "traceloom.gas/1"', /^spec: not valid JSON/],
    [['compute', '/no/such/file.json'], undefined, /^spec file not found/],
    [['compute', '-', '--colour'], trap, /^Unknown option '--colour'/],
    [['compute', '-', '--format', 'xml'], trap, /^--format must be/],
    [['compute', '-'], trap.replace('"nMax":4', '"nMax":-1'), /^nMax: must be at least 0/],
    [['compute', '-'], trap.replace('q^(L/2)', 'q^(L/2'), /^weights\.expression: /],
    [
      ['compute', '-'],
      trap.replace('q^(L/2)', 'zeta(L)'),
      /^weights\.expression: unknown function zeta/,
    ],
    [['frobnicate'], undefined, /^unknown command frobnicate/],
    [['compute', '-', '--format', 'matrix'], numericSpec(), /^--format matrix needs a series gas/],
  ])('bad input %j: exit 2, one line on stderr, no stack trace', (args, input, message) => {
    const r = run(args, input);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(message);
    expect(r.err.trim().split('\n')).toHaveLength(1);
    expect(r.err).not.toMatch(/\bat .*\.js:\d+/);
    expect(r.out).toBe('');
  });
});

/** The trap at q = 1/10 in numeric mode: Z(2) = q^2/((1-q)(1-q^2)) = 10/891 (Andrews 1976). */
const numericTrap = JSON.stringify({
  format: 'traceloom.gas/1',
  statistics: 'fermion',
  variable: 'q',
  precision: 20,
  at: { q: '1/10' },
  nMax: 4,
  recognize: { basis: ['1'] },
  weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
});

describe('traceloom compute, numeric mode', () => {
  // 10/891 = 0.011223344556677890011223... (exact); 20 digits, correctly rounded
  it.each([
    [
      'table',
      /^2\s+recursion\s+one route\s+0\.011223344556677890011\s+\S+\s+10\/891 \(height 891/m,
    ],
    [
      'csv',
      /^N,Z\(N\),error,routes,route check,closed form\n[\s\S]*^2,0\.011223344556677890011,[\d.e-]+,recursion,one route,10\/891$/m,
    ],
    [
      'latex',
      /^Z\(2\) &= 0\.01122\\,33445\\,56677\\,89001\\,1 \\pm [^&]+ && \\frac\{10\}\{891\} \\\\$/m,
    ],
  ])(
    '--format %s shows the determined digits, the error and the closed form',
    (format, pattern) => {
      const r = run(['compute', '-', '--format', format], numericTrap);
      expect(r.err).toBe('');
      expect(r.code).toBe(0);
      expect(r.out).toMatch(pattern);
      expect(r.out).toContain('caution: Each error is an estimate, not a bound');
    },
  );

  it('streams the JSON result with {real, error} values', () => {
    const r = run(['compute', '-'], numericTrap);
    expect(r.code).toBe(0);
    const result = JSON.parse(r.out);
    expect(result.canonical[2].value.real).toBe('1.1223344556677890011e-2');
    expect(result.numeric.precision).toBe(20);
  });

  it.each([
    [
      numericTrap.replace('"precision":20', '"precision":200'),
      /^precision: must be at most 100 digits/,
    ],
    [
      numericTrap.replace('"at":{"q":"1/10"}', '"at":{"x":"1/10"}'),
      /^at\.x: fixes x, but the variable is q/,
    ],
  ])('bad numeric input: exit 2 naming the field', (input, message) => {
    const r = run(['compute', '-'], input);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(message);
  });
});

describe('csv cells (OWASP CSV injection)', () => {
  it.each([
    ['=1+1', "'=1+1"],
    ['-q + 1', "'-q + 1"],
    ['-3/4', '-3/4'],
    ['-5.0505050505050505051e-2', '-5.0505050505050505051e-2'],
    ['-1e5+1', "'-1e5+1"],
    ['1 + q, 2', '"1 + q, 2"'],
  ])('%s -> %s', (cell, expected) => {
    expect(csvCell(cell)).toBe(expected);
  });
});

describe('class row text', () => {
  it('is the same JSON as JSON.stringify', () => {
    const row = {
      N: 3,
      cycleType: [
        [1, 1],
        [2, 1],
      ] as [number, number][],
      size: '3',
      sign: -1 as const,
      contribution: { order: '10', terms: [['3/2', '-1/2']] as [string, string][] },
    };
    expect(JSON.parse(classRowText(row))).toEqual(row);
    const exact = { ...row, contribution: { order: null, terms: [] } };
    expect(JSON.parse(classRowText(exact))).toEqual(exact);
  });
});

describe('traceloom compute, sector sums', () => {
  const ring = (sectors: object) =>
    JSON.stringify({
      format: 'traceloom.gas/1',
      statistics: 'fermion',
      step: '1/2',
      order: '6',
      nMax: 3,
      weights: { kind: 'spectrum', expression: 'q^((abs(p) + abs(p + n))/2)' },
      sectors,
    });

  it('prints the sector summary under the canonical table', () => {
    const r = run(
      ['compute', '-', '--format', 'table'],
      ring({ index: ['n'], from: [null], to: [null] }),
    );
    expect(r.code).toBe(0);
    expect(r.out).toMatch(/sectors over n: \d+ computed, \d+ contributed/);
    expect(r.out).toMatch(/Z\(0\) = 1 by convention/);
    expect(r.out).toMatch(/sectors per row: N=1: \d+, N=2: \d+, N=3: \d+/);
    // sector n = 0 is the ring q^|p|: Z_0(1..3) start at q^0, q^1, q^2
    expect(r.out).toMatch(/\(n=0\)\s+yes\s+0 1 2/);
    // the lattice cut of every sector is said once
    expect(r.out.match(/spectrum lattice points cut off/g)).toHaveLength(1);
    expect(r.out).toMatch(
      /spectrum lattice points cut off at the order after \d+–\d+ terms \(\d+ times\)/,
    );
  });

  it('lists every sector in csv and refuses a divergent sum naming sectors', () => {
    const csv = run(
      ['compute', '-', '--format', 'csv'],
      ring({ index: ['n'], from: [-2], to: [2] }),
    );
    expect(csv.code).toBe(0);
    expect(csv.out).toMatch(/\nn,contributed,val Z_n\(1\),val Z_n\(2\),val Z_n\(3\)\n/);
    expect(csv.out.split('\n').filter((l) => /^-?\d,(true|false),/.test(l))).toHaveLength(5);
    const flat = JSON.stringify({
      format: 'traceloom.gas/1',
      statistics: 'fermion',
      order: '6',
      nMax: 2,
      weights: { kind: 'spectrum', expression: 'q^abs(p)' },
      sectors: { index: ['n'], from: [null], to: [null] },
    });
    const bad = run(['compute', '-'], flat);
    expect(bad.code).toBe(2);
    expect(bad.err).toMatch(/^sectors: the sector sum does not converge/);
  });
});

// The trap's Z(N) starts at q^(N^2/2) (DLMF 17.5, Euler): at O(q^8), Z(4) (from q^8) is not
// determined. Every format says so; none shows it as 0 or as agreeing.
describe('rows beyond the order in every format', () => {
  it('json: determined false, agrees null, the order advice', () => {
    const r = run(['compute', '-'], trap);
    const json = JSON.parse(r.out);
    expect(json.canonical[4]).toMatchObject({ determined: false, agrees: null });
    expect(json.canonical[3]).toMatchObject({ determined: true, agrees: true });
    expect(json.orderAdvice.undetermined).toEqual([4]);
  });
  it('csv, table and latex: "not determined" and "not compared"', () => {
    const csv = run(['compute', '-', '--format', 'csv'], trap).out.split('\n');
    expect(csv[5]).toBe('4,not determined (O(q^8)),,0,O(q^8),recursion+classSum,not compared');
    const table = run(['compute', '-', '--format', 'table'], trap).out;
    expect(table).toMatch(/^4 +recursion\+classSum +not compared +not determined \(O\(q\^8\)\)$/m);
    expect(table).toMatch(/Z\(N\) for N = 4 is not determined at O\(q\^8\)/);
    const latex = run(['compute', '-', '--format', 'latex'], trap).out;
    expect(latex).toContain('Z(4) &= \\text{not determined: } O(q^{8})');
  });
});

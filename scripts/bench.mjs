// `npm run bench`: times the engine's whole process on the benchmark tasks, beside PARI/GP when
// `gp` is on PATH (the exact tasks) or the numpy script (the numeric tasks), alternating the two commands; prints medians, ratios and whether the numbers
// agree. Options: --quick (2 runs instead of 5), --runs N, --no-build, --direct (also time the
// CLI without npm in front), and task names to filter. --scaling: trap and ring at three sizes
// with fitted growth exponents (bench-scaling.mjs); --preview: the latency of POST /api/compute
// (bench-preview.mjs), also measured at the end of a full run; --queue: 8 runs on 1 and on 2
// worker processes through the job queue (bench-queue.mjs).
import { spawnSync } from 'node:child_process';
import {
  existsSync,
  mkdtempSync,
  openSync,
  closeSync,
  readFileSync,
  readdirSync,
  rmSync,
  writeFileSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { buildAll, root } from './lib.mjs';
import { benchPreview, printPreview } from './bench-preview.mjs';
import { runScaling } from './bench-scaling.mjs';
import { benchQueue } from './bench-queue.mjs';

const args = process.argv.slice(2);
const flag = (name) => args.includes(name);
const runsArg = args.indexOf('--runs');
const runs = runsArg >= 0 ? Number(args[runsArg + 1]) : flag('--quick') ? 2 : 5;
const filters = args.filter((a, i) => !a.startsWith('--') && args[i - 1] !== '--runs');
const benchDir = path.resolve(
  process.env.TRACELOOM_BENCH_DIR ?? path.join(root, '..', 'shared', 'bench'),
);

if (!Number.isInteger(runs) || runs < 1) {
  console.error('bench: --runs needs a positive whole number');
  process.exit(2);
}
if (!existsSync(benchDir)) {
  console.error(`bench: task folder not found: ${benchDir} (set TRACELOOM_BENCH_DIR)`);
  process.exit(2);
}

const hasGp = spawnSync('sh', ['-c', 'command -v gp'], { encoding: 'utf8' }).status === 0;

/**
 * Tasks defined here rather than in the task folder: a spec and a check of our own result (no
 * yardstick). `largen-40`: the large-N analysis of the fermion harmonic trap, N <= 40, O(q^1800),
 * so the row N = 40 keeps 1000 terms after its leading q^800; its figure is the analysis alone
 * (`timings.largeNMs`), which must stay under 1 s. Expected: Z(N) = q^(N^2/2)/(q;q)_N (Andrews,
 * Theory of Partitions, Cor. 2.2), so Z(inf) = 1/(q;q)_inf (a_n = 1), agreement below q^(N+1),
 * first correction -q^(N+1).
 */
const BUILTIN = {
  'largen-40': {
    spec: {
      format: 'traceloom.gas/1',
      title: 'harmonic trap, large-N bench',
      statistics: 'fermion',
      variable: 'q',
      step: '1/2',
      order: '1800',
      nMax: 40,
      classTable: 0,
      weights: { kind: 'formula', expression: 'q^(L/2)/(1-q^L)' },
    },
    check(result) {
      const c = result.largeN?.classes?.[0];
      const m1 = c?.corrections?.[0];
      const ok =
        result.largeN.classes.length === 1 &&
        c.product?.pattern === 'a_n = 1' &&
        c.stabilizationFit === 'N + 1' &&
        m1?.status === 'found' &&
        m1.exponent === 'N + 1' &&
        m1.coefficient === '-1';
      const ms = result.timings.largeNMs;
      const speed = ms < 1000 ? 'under 1 s' : 'OVER 1 s';
      return `${ok ? 'as published' : 'WRONG large-N block'}; analysis ${ms.toFixed(0)} ms (${speed})`;
    },
  },
};

// the team's tasks, then our own (scripts/bench-tasks: tasks the shared folder does not hold)
const ownDir = path.join(root, 'scripts', 'bench-tasks');
const dirOf = new Map();
for (const dir of [benchDir, ownDir])
  for (const f of existsSync(dir) ? readdirSync(dir) : [])
    if (f.endsWith('.json') && !dirOf.has(f.slice(0, -5))) dirOf.set(f.slice(0, -5), dir);
const tasks = [...dirOf.keys(), ...Object.keys(BUILTIN)]
  .filter((t) => filters.length === 0 || filters.includes(t))
  .sort();

if (!flag('--no-build')) buildAll({ client: false });
const work = mkdtempSync(path.join(tmpdir(), 'traceloom-bench-'));

/** Runs a command with stdout to a file; returns wall seconds (exits on failure). */
function timed(command, argv, outFile, stdinFile) {
  const out = openSync(outFile, 'w');
  const input = stdinFile ? openSync(stdinFile, 'r') : 'ignore';
  const started = process.hrtime.bigint();
  const r = spawnSync(command, argv, { cwd: root, stdio: [input, out, 'pipe'], encoding: 'utf8' });
  const seconds = Number(process.hrtime.bigint() - started) / 1e9;
  closeSync(out);
  if (typeof input === 'number') closeSync(input);
  if (r.status !== 0) {
    console.error(
      `bench: ${command} ${argv.join(' ')} failed (exit ${r.status ?? r.signal}): ${r.stderr}`,
    );
    process.exit(1);
  }
  return seconds;
}

const median = (xs) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

/** "a", "a/b" or a decimal like "999.5" as a reduced [num, den] of BigInts. */
function rational(text) {
  const t = text.trim();
  let num;
  let den = 1n;
  if (t.includes('/')) {
    const [a, b] = t.split('/');
    num = BigInt(a);
    den = BigInt(b);
  } else if (t.includes('.')) {
    const [a, b] = t.split('.');
    den = 10n ** BigInt(b.length);
    num = BigInt(a.replace('-', '')) * den + BigInt(b);
    if (a.startsWith('-')) num = -num;
  } else num = BigInt(t);
  const g = (x, y) => (y === 0n ? (x < 0n ? -x : x) : g(y, x % y));
  const d = g(num, den) || 1n;
  return [num / d, den / d];
}
const same = (x, y) => x[0] * y[1] === y[0] * x[1];

/** What the gp script printed: N, exponent, value (and the class count when given). */
function parseGp(text) {
  const m = /Z\((\d+)\)(?: coefficient of q\^(-?[\d./]+))?\s*[:=]\s*(-?[\d/]+)/.exec(text);
  if (!m) return null;
  const count = /classes (\d+)/.exec(text);
  return {
    N: Number(m[1]),
    exponent: m[2] ?? '0',
    value: m[3],
    classes: count ? Number(count[1]) : null,
  };
}

/** The same coefficient (and class-row count) from our result JSON. */
function ours(file, want) {
  const result = JSON.parse(readFileSync(file, 'utf8'));
  const row = result.canonical.find((r) => r.N === want.N);
  const e = rational(want.exponent);
  const term = row?.value.terms.find(([x]) => same(rational(x), e));
  const classes = (result.classes ?? []).filter((c) => c.N === want.N).length;
  return { value: term ? term[1] : '0', classes };
}

/** Published closed forms of the line kernel's Z(1..4) (see ../shared/SOURCES.md), to 45 digits. */
function lineKernelClosedForms() {
  const py =
    'from mpmath import mp, pi\nmp.dps = 45\n' +
    'for v in [mp.mpf(1)/4, 1/(16*pi), (pi-3)/(64*pi), (10-pi**2)/(1024*pi**2)]: print(mp.nstr(v, 40))';
  const r = spawnSync('python3', ['-c', py], { encoding: 'utf8' });
  return r.status === 0 ? r.stdout.trim().split('\n') : null;
}

/** A decimal text as {int, exp}: value = int * 10^exp, int a BigInt of its digits. */
function decimal(text) {
  const m = /^(-?)(\d*)\.?(\d*)(?:e([+-]?\d+))?$/i.exec(text.trim());
  const digits = `${m[2]}${m[3]}`;
  const int = BigInt(digits || '0') * (m[1] ? -1n : 1n);
  return { int, exp: Number(m[4] ?? 0) - m[3].length, digits: digits.replace(/^0+/, '').length };
}

/** Is `real` (its shown digits) the correct rounding of the longer reference text? */
function digitsAgree(real, reference, digits) {
  const a = decimal(real);
  const b = decimal(reference);
  // round a once to `digits` significant digits, then b to a's last kept unit
  const drop = Math.max(0, a.digits - digits);
  const cut = 10n ** BigInt(drop);
  const ai = drop === 0 ? a.int : (a.int + (a.int < 0n ? -cut / 2n : cut / 2n)) / cut;
  const shift = a.exp + drop - b.exp;
  if (shift <= 0) return ai === b.int * 10n ** BigInt(-shift);
  const unit = 10n ** BigInt(shift);
  const half = unit / 2n;
  return (b.int + (b.int < 0n ? -half : half)) / unit === ai;
}

/** The numeric tasks: digits shown against the yardstick's and the published closed forms. */
function numericVerdict(outFile, pyOut) {
  const result = JSON.parse(readFileSync(outFile, 'utf8'));
  const closed = lineKernelClosedForms();
  const problems = [];
  let shown = Infinity;
  for (const row of result.canonical) {
    if (row.N === 0) continue;
    const digits = row.value.real
      .replace(/e.*$/, '')
      .replace(/[-.]/g, '')
      .replace(/^0+/, '').length;
    shown = Math.min(shown, digits);
    if (closed && row.N <= 4 && !digitsAgree(row.value.real, closed[row.N - 1], digits))
      problems.push(`Z(${row.N}) ${row.value.real} vs ${closed[row.N - 1]}`);
    if (pyOut) {
      const m = new RegExp(`Z\\(${row.N}\\) = (\\S+)`).exec(pyOut);
      if (m && !digitsAgree(row.value.real, m[1], Math.min(digits, 11)))
        problems.push(`Z(${row.N}) ${row.value.real} vs yardstick ${m[1]}`);
    }
  }
  const recognized = result.canonical.filter((r) => r.recognized).map((r) => r.N);
  let text = problems.length
    ? `WRONG ${problems.join('; ')}`
    : `digits correct (>= ${shown} shown)`;
  if (result.spec.recognize) text += `, recognized N = ${recognized.join(',') || 'none'}`;
  return text;
}

/** One scaling size: both sides timed `runs` times, alternating, and the coefficient compared. */
function measureScaling(specFile, gpFile) {
  const outFile = path.join(work, 'scaling.out.json');
  const gpOut = path.join(work, 'scaling.gp.txt');
  const t = { ours: [], engine: [], gp: [] };
  for (let i = 0; i < runs; i++) {
    t.ours.push(timed('npm', ['run', '-s', 'cli', '--', 'compute', specFile], outFile));
    t.engine.push(JSON.parse(readFileSync(outFile, 'utf8')).timings.totalMs / 1000);
    t.gp.push(timed('gp', ['-q', '-s', '2000000000', gpFile], gpOut, '/dev/null'));
  }
  const want = parseGp(readFileSync(gpOut, 'utf8'));
  const got = want && ours(outFile, want);
  const agree = !want
    ? 'gp output not understood'
    : same(rational(got.value), rational(want.value))
      ? 'identical'
      : `DIFFER (ours ${got.value}, gp ${want.value})`;
  return { ours: median(t.ours), engine: median(t.engine), gp: median(t.gp), agree };
}

if (flag('--scaling')) {
  if (!hasGp) {
    console.error('bench: --scaling needs gp on PATH (e.g. apt-get install -y pari-gp)');
    process.exit(2);
  }
  runScaling(benchDir, work, measureScaling);
  console.log(`(median of ${runs} per size)`);
  rmSync(work, { recursive: true, force: true });
  process.exit(0);
}
const previewRequests = flag('--quick') ? 20 : 40;
if (flag('--preview')) {
  rmSync(work, { recursive: true, force: true });
  printPreview(await benchPreview({ requests: previewRequests }), previewRequests);
  process.exit(0);
}
if (flag('--queue')) {
  rmSync(work, { recursive: true, force: true });
  await benchQueue();
  process.exit(0);
}

const rows = [];
for (const task of tasks) {
  const builtin = BUILTIN[task];
  const dir = dirOf.get(task) ?? benchDir;
  const spec = path.join(builtin ? work : dir, `${task}.json`);
  if (builtin) writeFileSync(spec, JSON.stringify(builtin.spec));
  const gpFile = path.join(dir, `${task}.gp`);
  const withGp = hasGp && existsSync(gpFile);
  const pyFile = path.join(dir, `${task}.py`);
  const withPy = existsSync(pyFile);
  const pyOut = path.join(work, `${task}.py.txt`);
  const outFile = path.join(work, `${task}.out.json`);
  const gpOut = path.join(work, `${task}.gp.txt`);
  const t = { ours: [], node: [], gp: [] };
  for (let i = 0; i < runs; i++) {
    t.ours.push(timed('npm', ['run', '-s', 'cli', '--', 'compute', spec], outFile));
    if (withGp) t.gp.push(timed('gp', ['-q', '-s', '2000000000', gpFile], gpOut, '/dev/null'));
    if (withPy) t.gp.push(timed('python3', [pyFile], pyOut, '/dev/null'));
    if (flag('--direct')) {
      const cli = path.join(root, 'dist/cli/traceloom.mjs');
      t.node.push(timed(process.execPath, [cli, 'compute', spec], outFile));
    }
  }
  let agree = 'no gp';
  const spec0 = JSON.parse(readFileSync(spec, 'utf8'));
  if (builtin) {
    agree = builtin.check(JSON.parse(readFileSync(outFile, 'utf8')));
  } else if (spec0.precision !== undefined) {
    agree = numericVerdict(outFile, withPy ? readFileSync(pyOut, 'utf8') : null);
  } else if (withGp || withPy) {
    const want = parseGp(readFileSync(withGp ? gpOut : pyOut, 'utf8'));
    if (!want) agree = 'yardstick output not understood';
    else {
      const got = ours(outFile, want);
      const valueOk = same(rational(got.value), rational(want.value));
      const countOk = want.classes === null || want.classes === got.classes;
      agree =
        valueOk && countOk ? 'identical' : `DIFFER (ours ${got.value}, yardstick ${want.value})`;
      if (want.classes !== null) agree += ` (${got.classes} classes)`;
    }
  }
  const o = median(t.ours);
  const g = withGp || withPy ? median(t.gp) : null;
  rows.push({ task, o, n: t.node.length ? median(t.node) : null, g, agree });
  console.log(
    `  ${task}: ours ${t.ours.map((x) => x.toFixed(2)).join(' ')}  gp ${t.gp.map((x) => x.toFixed(2)).join(' ')}`,
  );
}
rmSync(work, { recursive: true, force: true });

const pad = (s, n) => String(s).padEnd(n);
console.log(
  `\nmedian of ${runs}, whole process, output to a file (node = the CLI without npm, with --direct)\n`,
);
console.log(
  `${pad('task', 12)}| ${pad('ours s', 8)}| ${pad('node s', 8)}| ${pad('yard s', 8)}| ${pad('ratio', 6)}| numbers`,
);
console.log(
  `${'-'.repeat(12)}|${'-'.repeat(9)}|${'-'.repeat(9)}|${'-'.repeat(9)}|${'-'.repeat(7)}|--------`,
);
for (const r of rows) {
  const ratio = r.g ? (r.o / r.g).toFixed(2) : '-';
  console.log(
    `${pad(r.task, 12)}| ${pad(r.o.toFixed(2), 8)}| ${pad(r.n === null ? '-' : r.n.toFixed(2), 8)}| ${pad(r.g ? r.g.toFixed(2) : '-', 8)}| ${pad(ratio, 6)}| ${r.agree}`,
  );
}
if (!hasGp)
  console.log('\n(gp not on PATH: install PARI/GP, e.g. apt-get install -y pari-gp, to compare)');
if (filters.length === 0)
  printPreview(await benchPreview({ requests: previewRequests }), previewRequests);

// `npm run bench -- --scaling`: the harmonic trap and the ring spectrum at three sizes each, N and
// the order doubling from size to size up to the bench tasks trap-70 and ring-40, timed as whole
// processes beside the yardstick (the tasks' gp scripts with their size line changed), with the
// growth exponent e of time ~ N^e fitted to each column by least squares on log-log.
import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';

/** The three sizes per task: [N, order]; the largest is the shared task itself. */
export const SCALING = {
  'trap-70': [
    [18, 750],
    [35, 1500],
    [70, 3000],
  ],
  'ring-40': [
    [10, 250],
    [20, 500],
    [40, 1000],
  ],
};

/**
 * The spec and gp script of a task at another size. The gp scripts work in y = q^(1/2) with
 * M = 2 order - 1 and print the coefficient of y^(M-1) (trap) or y^M (ring) in Z(Nmax).
 */
export function scaledTask(benchDir, task, N, order) {
  const spec = JSON.parse(readFileSync(path.join(benchDir, `${task}.json`), 'utf8'));
  const gp = readFileSync(path.join(benchDir, `${task}.gp`), 'utf8');
  const M = 2 * order - 1;
  const sizeLine = /M=(\d+); Nmax=(\d+);/;
  const old = sizeLine.exec(gp);
  const print = /print\("Z\((\d+)\) coefficient of q\^([\d.]+): ", polcoeff\(Z\[(\d+)\],(\d+)\)\);/;
  const p = print.exec(gp);
  if (!old || !p)
    throw new Error(`bench: ${task}.gp does not have the expected size and print lines`);
  const index = Number(p[4]) - Number(old[1]) + M; // same offset from M as in the task
  const gpText = gp
    .replace(sizeLine, `M=${M}; Nmax=${N};`)
    .replace(
      print,
      `print("Z(${N}) coefficient of q^${index / 2}: ", polcoeff(Z[${N + 1}],${index}));`,
    );
  return {
    spec: {
      ...spec,
      title: `${spec.title} (N ${N}, order ${order})`,
      nMax: N,
      order: String(order),
    },
    gp: gpText,
  };
}

/** Least-squares slope of log t against log N. */
export function growthExponent(ns, ts) {
  const x = ns.map(Math.log);
  const y = ts.map(Math.log);
  const mx = x.reduce((a, b) => a + b) / x.length;
  const my = y.reduce((a, b) => a + b) / y.length;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < x.length; i++) {
    sxy += (x[i] - mx) * (y[i] - my);
    sxx += (x[i] - mx) ** 2;
  }
  return sxy / sxx;
}

/**
 * Times every size (`measure(specFile, gpFile)` returns {ours, engine, gp, agree} in seconds) and
 * prints the table and the fitted exponents.
 */
export function runScaling(benchDir, work, measure) {
  const lines = [];
  for (const [task, sizes] of Object.entries(SCALING)) {
    const rows = sizes.map(([N, order]) => {
      const { spec, gp } = scaledTask(benchDir, task, N, order);
      const specFile = path.join(work, `${task}-${N}.json`);
      const gpFile = path.join(work, `${task}-${N}.gp`);
      writeFileSync(specFile, JSON.stringify(spec));
      writeFileSync(gpFile, gp);
      return { N, order, ...measure(specFile, gpFile) };
    });
    const ns = rows.map((r) => r.N);
    for (const r of rows)
      lines.push(
        `${task.slice(0, 4).padEnd(5)}| ${String(r.N).padEnd(4)}| ${String(r.order).padEnd(6)}| ${r.ours.toFixed(2).padEnd(8)}| ${r.engine.toFixed(2).padEnd(9)}| ${r.gp.toFixed(2).padEnd(7)}| ${(r.ours / r.gp).toFixed(2).padEnd(6)}| ${r.agree}`,
      );
    const e = (key) =>
      growthExponent(
        ns,
        rows.map((r) => r[key]),
      ).toFixed(2);
    lines.push(
      `${task.slice(0, 4).padEnd(5)}| fitted exponent e (time ~ N^e, order ~ N): ours ${e('ours')}, engine ${e('engine')}, gp ${e('gp')}`,
    );
  }
  console.log(
    '\nscaling: whole process (ours, gp) and the engine alone (timings.totalMs), seconds\n',
  );
  console.log('task | N   | order | ours s  | engine s | gp s   | ratio | numbers');
  console.log('-----|-----|-------|---------|----------|--------|-------|--------');
  for (const l of lines) console.log(l);
}

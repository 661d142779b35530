// `npm test`: install what is missing, build, then run every suite (engine, server, client, e2e).
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { buildAll, ensureInstalled, run } from './lib.mjs';

const CHROMIUM = process.env.TRACELOOM_CHROMIUM ?? '/usr/bin/chromium';

function ensureChromium() {
  if (existsSync(CHROMIUM)) return;
  if (process.getuid?.() === 0) {
    console.log('› installing Debian chromium for the browser tests…');
    run('apt-get', ['update', '-q']);
    run('apt-get', ['install', '-y', '-q', 'chromium'], {
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
    return;
  }
  console.error(
    `The browser tests need Chromium at ${CHROMIUM}. Install it with\n` +
      '  sudo apt-get install -y chromium\n' +
      'or point TRACELOOM_CHROMIUM at a Chromium binary, then run npm test again.',
  );
  process.exit(1);
}

/** pdflatex for the test that compiles the LaTeX exports (Debian's texlive-latex-base, when root). */
function ensurePdflatex() {
  if (spawnSync('sh', ['-c', 'command -v pdflatex']).status === 0) return;
  if (process.getuid?.() !== 0) {
    console.log(
      '› pdflatex not found: the LaTeX compile test is skipped (apt-get install texlive-latex-base)',
    );
    return;
  }
  console.log('› installing Debian texlive-latex-base for the LaTeX export test…');
  run('apt-get', ['update', '-q']);
  run('apt-get', ['install', '-y', '-q', '--no-install-recommends', 'texlive-latex-base'], {
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
}

/** Debian's redis-server for the queue-mode suite (installed when root, else the suite skips). */
function ensureRedis() {
  if (spawnSync('sh', ['-c', 'command -v redis-server']).status === 0) return;
  if (process.getuid?.() !== 0) {
    console.log(
      '› redis-server not found: the queue suite is skipped (apt-get install redis-server)',
    );
    return;
  }
  console.log('› installing Debian redis-server for the queue suite…');
  run('apt-get', ['update', '-q']);
  run('apt-get', ['install', '-y', '-q', 'redis-server'], {
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
}

const times = {};
const started = Date.now();
ensureInstalled();
ensureChromium();
ensurePdflatex();
ensureRedis();
times.build = timed(() => buildAll());
// formatting and a type check of every spec and e2e file (after the build: specs import shared/dist)
times.lint = timed(() => run('npm', ['run', '-s', 'lint']));
times.engine = timed(() => run('npx', ['vitest', 'run', '--project', 'shared']));
times.server = timed(() => run('npx', ['vitest', 'run', '--project', 'server']));
times.timing = timed(() => run('npx', ['vitest', 'run', '--project', 'server-timing']));
times.queue = timed(() => run('npx', ['vitest', 'run', '--project', 'server-queue']));
times.client = timed(() =>
  run('npx', ['ng', 'test', 'traceloom', '--watch=false'], {
    env: { ...process.env, NG_CLI_ANALYTICS: 'false', CI: '1' },
  }),
);
times.e2e = timed(() => run('npx', ['vitest', 'run', '--project', 'e2e']));
console.log('\n✓ all suites passed');
for (const [k, v] of Object.entries(times))
  console.log(`  ${k.padEnd(8)} ${(v / 1000).toFixed(1)} s`);
console.log(`  total    ${((Date.now() - started) / 1000).toFixed(1)} s`);

function timed(fn) {
  const t = Date.now();
  fn();
  return Date.now() - t;
}

// Bundles the compiled command line (dist/server/cli/main.js and the shared library it imports)
// into one file, dist/cli/traceloom.cjs, and writes its entry dist/cli/traceloom.mjs (a copy of
// scripts/cli-loader.mjs), the bundle's hash with its size and time (traceloom.key.json) and
// V8's code cache for it, dist/cli/traceloom.<hash>.cache, from training runs on the specs in
// scripts/cli-training/ (see bench/README.md: the classes-40 start-up paragraph and "Numeric
// tasks").
// `npm run build:server` runs it after tsc.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import {
  copyFileSync,
  existsSync,
  mkdirSync,
  readdirSync,
  readFileSync,
  rmSync,
  statSync,
  writeFileSync,
} from 'node:fs';
import path from 'node:path';
import { build } from 'esbuild';
import { root } from './lib.mjs';

const entry = path.join(root, 'dist/server/cli/main.js');
const out = path.join(root, 'dist/cli');
const parserOnly = path.join(root, 'shared/dist/engine/expr/parser-only.js');

if (!existsSync(entry) || !existsSync(parserOnly)) {
  console.error(
    `bundle-cli: ${entry} is missing; run npm run build:shared && npm run build:server`,
  );
  process.exit(2);
}
const noLocales = path.join(out, 'no-locales.mjs');
mkdirSync(out, { recursive: true }); // a fresh clone has no dist/cli yet
await build({
  entryPoints: [entry],
  outfile: path.join(out, 'traceloom.cjs'),
  bundle: true,
  platform: 'node',
  format: 'cjs',
  target: 'node20',
  minify: true,
  charset: 'ascii',
  logLevel: 'warning',
  plugins: [
    {
      // the parser alone instead of the whole single-file build (see engine/expr/parser-only.ts)
      name: 'parser-only',
      setup(b) {
        b.onResolve({ filter: /^mathjs\/lib\/browser\/math\.js$/ }, () => ({ path: parserOnly }));
      },
    },
    {
      // zod's translations of its messages (some 40 languages, a third of the bundle): the engine
      // words its own messages, and zod's English default is built in (classic/schemas.js)
      name: 'no-zod-locales',
      setup(b) {
        b.onStart(() => writeFileSync(noLocales, 'export {};\n'));
        b.onResolve({ filter: /\/locales\/index\.js$/ }, (a) =>
          a.importer.includes(`${path.sep}zod${path.sep}`) ? { path: noLocales } : undefined,
        );
      },
    },
  ],
});
rmSync(noLocales, { force: true });
rmSync(path.join(out, 'traceloom.mjs'), { force: true });
copyFileSync(path.join(root, 'scripts/cli-loader.mjs'), path.join(out, 'traceloom.mjs'));

// the bundle's hash (the cache's name) with its size and modification time, so that the loader
// need not hash it on every command (see cli-loader.mjs); the same text the loader hashes
const bundle = path.join(out, 'traceloom.cjs');
const source = readFileSync(bundle, 'latin1').replace(/^#!.*/, '');
const { size, mtimeMs } = statSync(bundle);
writeFileSync(
  path.join(out, 'traceloom.key.json'),
  `${JSON.stringify({ size, mtimeMs, hash: createHash('sha1').update(source).digest('hex').slice(0, 16) })}\n`,
);

// training runs: each loads the cache the previous one wrote and adds what it compiled
for (const f of readdirSync(out)) if (f.endsWith('.cache')) rmSync(path.join(out, f));
for (const spec of ['kernel.json', 'series.json']) {
  const r = spawnSync(
    process.execPath,
    [path.join(out, 'traceloom.mjs'), 'compute', `scripts/cli-training/${spec}`],
    {
      cwd: root,
      stdio: ['ignore', 'ignore', 'pipe'],
      encoding: 'utf8',
      env: { ...process.env, TRACELOOM_CODE_CACHE_WRITE: '1' },
    },
  );
  if (r.status !== 0) {
    console.error(`bundle-cli: the training run on ${spec} failed: ${r.stderr}`);
    process.exit(1);
  }
}

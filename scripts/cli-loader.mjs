// The command line's entry, copied to dist/cli/traceloom.mjs by scripts/bundle-cli.mjs: it runs
// the bundle dist/cli/traceloom.cjs through vm.Script with V8's code cache for it
// (dist/cli/traceloom.<hash of the bundle>.cache, written at build time by training runs), so
// that a command neither parses the bundle nor compiles the functions it calls (bytecode comes
// from the cache; Node 20 has no module.enableCompileCache). The cache holds compiled code only,
// never a result. A cache V8 rejects (another Node version, other flags) or a missing one only
// costs the compile time. TRACELOOM_CODE_CACHE_WRITE=1 writes the cache when the process exits
// (the training runs).
import { readFileSync, statSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import vm from 'node:vm';

const dir = path.dirname(fileURLToPath(import.meta.url));
const file = path.join(dir, 'traceloom.cjs');
// esbuild writes ASCII (non-ASCII characters escaped), so latin1 reads it exactly and quickest
const source = readFileSync(file, 'latin1').replace(/^#!.*/, '');
// V8 checks a cache against the source's length only: the name carries a hash of the bundle, so
// a cache is never applied to another bundle. The build records that hash with the bundle's size
// and modification time (traceloom.key.json): a command whose bundle still has them reads the
// hash instead of loading node:crypto (some 10-30 ms of its start) to compute it again
const hash =
  recordedHash() ??
  (await import('node:crypto')).createHash('sha1').update(source).digest('hex').slice(0, 16);
const cacheFile = path.join(dir, `traceloom.${hash}.cache`);
let cachedData;
try {
  cachedData = readFileSync(cacheFile);
} catch {
  cachedData = undefined;
}
const script = new vm.Script(
  `(function (require, module, exports, __filename, __dirname) {${source}\n})`,
  { filename: file, cachedData },
);
if (process.env.TRACELOOM_CODE_CACHE_WRITE === '1')
  process.on('exit', () => writeFileSync(cacheFile, script.createCachedData()));
const module = { exports: {} };
script.runInThisContext()(createRequire(file), module, module.exports, file, dir);

/** The hash the build recorded for this bundle, or null when the bundle is not that file. */
function recordedHash() {
  try {
    const key = JSON.parse(readFileSync(path.join(dir, 'traceloom.key.json'), 'utf8'));
    const st = statSync(file);
    return key.size === st.size && key.mtimeMs === st.mtimeMs && /^[0-9a-f]{16}$/.test(key.hash)
      ? key.hash
      : null;
  } catch {
    return null;
  }
}

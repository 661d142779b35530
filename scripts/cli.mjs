// `npm run cli -- ...`: runs the bundled command line (dist/cli/traceloom.mjs, written by
// `npm run build:server`). On a fresh clone, before any build, it says in one line what to run.
import { existsSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';

const bundle =
  process.env.TRACELOOM_CLI_BUNDLE ??
  fileURLToPath(new URL('../dist/cli/traceloom.mjs', import.meta.url));
if (!existsSync(bundle)) {
  console.error(
    'traceloom: the command line is not built yet; run `npm run build:shared && npm run build:server` (or `npm run build`) first',
  );
  process.exit(2);
}
await import(pathToFileURL(bundle).href);

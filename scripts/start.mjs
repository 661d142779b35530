// `npm start`: install if needed, build, migrate + seed the demo database, serve app and API.
import { spawn } from 'node:child_process';
import path from 'node:path';
import { buildAll, ensureInstalled, root } from './lib.mjs';

ensureInstalled();
buildAll();

const env = {
  ...process.env,
  TRACELOOM_MODE: process.env.TRACELOOM_MODE ?? 'demo',
  PORT: process.env.PORT ?? '4300',
  TRACELOOM_DB: process.env.TRACELOOM_DB ?? path.join(root, 'data', 'traceloom.sqlite'),
};
console.log('› starting the server (migrations run at start-up)…');
const server = spawn(process.execPath, ['dist/server/main.js'], {
  cwd: root,
  env,
  stdio: 'inherit',
});
for (const signal of ['SIGINT', 'SIGTERM']) process.on(signal, () => server.kill(signal));
server.on('exit', (code) => process.exit(code ?? 0));

// `npm run worker`: install if needed, build shared/ and server/ when missing, take run jobs
// from the queue at TRACELOOM_QUEUE_URL (see docs/deployment.md).
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { buildAll, ensureInstalled, root } from './lib.mjs';

const entry = path.join(root, 'dist', 'server', 'queue', 'worker-main.js');
ensureInstalled();
if (!existsSync(entry)) buildAll({ client: false });
const worker = spawn(process.execPath, [entry], { cwd: root, stdio: 'inherit' });
// Ctrl-C reaches the whole process group already; a service manager's SIGTERM is passed on.
process.on('SIGINT', () => {});
process.on('SIGTERM', () => worker.kill('SIGTERM'));
worker.on('exit', (code) => process.exit(code ?? 0));

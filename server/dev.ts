import { spawn } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createServer } from 'vite';

// Development: the API (restarted on change by node --watch) plus Vite's dev server with hot reload,
// which proxies /api to the API (see vite.config.ts).
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

const api = spawn(process.execPath, ['--import', 'tsx', '--watch-path=server', '--watch-path=shared', '--watch-path=migrations', 'server/index.ts'], {
  cwd: root,
  env: { ...process.env, PLANKTIDE_CLIENT: 'none' },
  stdio: 'inherit',
});

const vite = await createServer({ root, configFile: path.join(root, 'vite.config.ts') });
await vite.listen();
vite.printUrls();

let stopping = false;
const stop = async () => {
  if (stopping) return;
  stopping = true;
  await vite.close();
  api.kill('SIGINT');
};
api.once('exit', (code) => {
  void stop().then(() => process.exit(code ?? 0));
});
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());

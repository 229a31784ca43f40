/**
 * `npm run dev`: the API on :3000 (restarted by tsx watch from the package script) plus the
 * Vite dev server on :5173 with hot reload, proxying /api to the API.
 */
import { spawn } from 'node:child_process';

const children = [
  spawn('npx', ['tsx', 'watch', '--clear-screen=false', 'server/start.ts'], { stdio: 'inherit', env: { ...process.env, NODE_ENV: 'development' } }),
  spawn('npx', ['vite', '--port', '5173'], { stdio: 'inherit' }),
];
const stop = () => children.forEach((c) => c.kill('SIGTERM'));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

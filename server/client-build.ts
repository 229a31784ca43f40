import fs from 'node:fs';
import path from 'node:path';

/** Newest modification time among files under these paths (directories walked). */
function newestMtime(paths: string[]): number {
  let newest = 0;
  const walk = (p: string) => {
    if (!fs.existsSync(p)) return;
    const stat = fs.statSync(p);
    if (stat.isDirectory()) for (const entry of fs.readdirSync(p)) walk(path.join(p, entry));
    else newest = Math.max(newest, stat.mtimeMs);
  };
  paths.forEach(walk);
  return newest;
}

/** True when dist/ is missing or older than the client sources. */
export function clientBuildIsStale(root: string): boolean {
  const built = path.join(root, 'dist', 'index.html');
  if (!fs.existsSync(built)) return true;
  const sources = ['src', 'public', 'index.html', 'vite.config.ts', 'package.json'].map((p) => path.join(root, p));
  return newestMtime(sources) > fs.statSync(built).mtimeMs;
}

/** Builds the client with Vite (programmatically, no shell). */
export async function buildClient(root: string): Promise<void> {
  const { build } = await import('vite');
  await build({ root, configFile: path.join(root, 'vite.config.ts'), logLevel: 'warn', mode: 'production' });
}

/**
 * Port choice for `npm start` and its stand-ins: the usual port when it is free, otherwise
 * one the system hands out. The chosen ports are probed and released; the caller listens on
 * them right after (another program could take one in between; then listening fails loudly).
 */
import net from 'node:net';

/** Listens on port (0 = any free one); the bound port, or null when that port is taken. */
function claim(port: number, host: string): Promise<{ port: number; server: net.Server } | null> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', (err: NodeJS.ErrnoException) => {
      if (err.code === 'EADDRINUSE' || err.code === 'EACCES') resolve(null);
      else reject(err);
    });
    server.listen({ port, host, exclusive: true }, () => resolve({ port: (server.address() as net.AddressInfo).port, server }));
  });
}

function release(servers: net.Server[]): Promise<void> {
  return Promise.all(servers.map((s) => new Promise<void>((resolve) => s.close(() => resolve())))).then(() => undefined);
}

/** True when nothing listens on port at host (0.0.0.0 checks every interface). */
export async function isPortFree(port: number, host = '127.0.0.1'): Promise<boolean> {
  const claimed = await claim(port, host);
  if (!claimed) return false;
  await release([claimed.server]);
  return true;
}

/**
 * One port per preferred port, in order: the preferred one when free, otherwise a free one.
 * All are held until every one is chosen, so the answers differ from each other.
 */
export async function pickPorts(preferred: readonly number[], host = '127.0.0.1'): Promise<number[]> {
  const held: net.Server[] = [];
  try {
    const ports: number[] = [];
    for (const port of preferred) {
      const claimed = (await claim(port, host)) ?? (await claim(0, host));
      if (!claimed) throw new Error(`No free port on ${host}.`);
      held.push(claimed.server);
      ports.push(claimed.port);
    }
    return ports;
  } finally {
    await release(held);
  }
}

/** The preferred port when free, otherwise a free one. */
export async function pickPort(preferred: number, host = '127.0.0.1'): Promise<number> {
  const [port] = (await pickPorts([preferred], host)) as [number];
  return port;
}

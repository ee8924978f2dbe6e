// Small network helpers for the orchestration scripts.
import net from 'node:net';

/** True when something accepts connections on host:port. */
export function portInUse(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port });
    socket.setTimeout(1000);
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('timeout', () => {
      socket.destroy();
      resolve(false);
    });
    socket.once('error', () => resolve(false));
  });
}

export async function waitForHttp(url: string, ms: number, accept: (status: number) => boolean = (s) => s === 200): Promise<number | null> {
  const until = Date.now() + ms;
  let last: number | null = null;
  while (Date.now() < until) {
    try {
      const res = await fetch(url, { signal: AbortSignal.timeout(2000) });
      last = res.status;
      if (accept(res.status)) return res.status;
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 150));
  }
  return last;
}

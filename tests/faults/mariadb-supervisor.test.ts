// The supervisor `npm start` runs beside MariaDB, on a fake process: a dead pid is started again
// after a growing backoff, a stable run resets it, it gives up after failures in a row, and after
// stop() nothing is started again. The fake has no way to signal: the supervisor only watches.
import { describe, expect, it } from 'vitest';
import { superviseProcess, type SupervisorEvent } from '../../scripts/lib/mariadb';

/** Processes that live until the test kills them; `start` may be told to fail. */
function fakeProcesses() {
  const live = new Set<number>();
  let next = 100;
  let failStarts = 0;
  const started: number[] = [];
  return {
    live,
    started,
    spawn() {
      const pid = next++;
      live.add(pid);
      return pid;
    },
    failNextStarts(n: number) {
      failStarts = n;
    },
    async restart() {
      await new Promise((r) => setTimeout(r, 1));
      if (failStarts > 0) {
        failStarts -= 1;
        throw new Error('MariaDB did not start (exit code 1).');
      }
      const pid = next++;
      live.add(pid);
      started.push(pid);
      return pid;
    },
  };
}

async function until(check: () => boolean, ms = 2000) {
  const end = Date.now() + ms;
  while (!check()) {
    if (Date.now() > end) throw new Error('condition not met in time');
    await new Promise((r) => setTimeout(r, 2));
  }
}

const BACKOFF = [5, 10, 20, 40];

describe('superviseProcess', () => {
  it('starts a dead process again after the first backoff step and watches the new pid', async () => {
    const p = fakeProcesses();
    const events: SupervisorEvent[] = [];
    const first = p.spawn();
    const s = superviseProcess({ pid: first, restart: p.restart, isAlive: (pid) => p.live.has(pid), backoffMs: BACKOFF, checkEveryMs: 2, onEvent: (e) => events.push(e) });
    await new Promise((r) => setTimeout(r, 20));
    expect(p.started).toEqual([]);

    p.live.delete(first);
    await until(() => s.restarts === 1);
    expect(s.pid).toBe(p.started[0]);
    expect(events.map((e) => e.type)).toEqual(['died', 'restarting', 'restarted']);
    expect(events[1]).toMatchObject({ delayMs: BACKOFF[0], attempt: 1 });

    // the new one dies too: started again
    p.live.delete(s.pid);
    await until(() => s.restarts === 2);
    await s.stop();
    expect(await s.done).toBe('stopped');
  });

  it('waits longer after each failed start and gives up after maxFailures in a row', async () => {
    const p = fakeProcesses();
    const events: SupervisorEvent[] = [];
    const first = p.spawn();
    const s = superviseProcess({ pid: first, restart: p.restart, isAlive: (pid) => p.live.has(pid), backoffMs: BACKOFF, checkEveryMs: 2, maxFailures: 4, onEvent: (e) => events.push(e) });
    p.failNextStarts(100);
    p.live.delete(first);
    expect(await s.done).toBe('gave-up');
    const delays = events.filter((e) => e.type === 'restarting').map((e) => (e as { delayMs: number }).delayMs);
    expect(delays).toEqual([5, 10, 20, 40]);
    expect(events.filter((e) => e.type === 'restart-failed')).toHaveLength(4);
    expect(events.at(-1)).toMatchObject({ type: 'gave-up', failures: 4 });
    expect((events.at(-1) as { error: Error }).error.message).toMatch(/did not start/);
    expect(p.started).toEqual([]);
  });

  it('counts quick deaths as failures and resets the backoff after a stable run', async () => {
    const p = fakeProcesses();
    const events: SupervisorEvent[] = [];
    let clock = 0;
    const first = p.spawn();
    const s = superviseProcess({
      pid: first,
      restart: p.restart,
      isAlive: (pid) => p.live.has(pid),
      backoffMs: BACKOFF,
      checkEveryMs: 2,
      stableMs: 1000,
      now: () => clock,
      onEvent: (e) => events.push(e),
    });
    const delays = () => events.filter((e) => e.type === 'restarting').map((e) => (e as { delayMs: number }).delayMs);

    p.live.delete(first);
    await until(() => s.restarts === 1);
    // dies again at once, twice: the wait grows
    p.live.delete(s.pid);
    await until(() => s.restarts === 2);
    p.live.delete(s.pid);
    await until(() => s.restarts === 3);
    expect(delays()).toEqual([5, 10, 20]);

    // up for longer than stableMs: the next death starts from the first step again
    clock += 5000;
    await new Promise((r) => setTimeout(r, 20));
    p.live.delete(s.pid);
    await until(() => s.restarts === 4);
    expect(delays()).toEqual([5, 10, 20, 5]);
    await s.stop();
  });

  it('starts nothing after stop(), even when the process dies during the wait', async () => {
    const p = fakeProcesses();
    const first = p.spawn();
    const s = superviseProcess({ pid: first, restart: p.restart, isAlive: (pid) => p.live.has(pid), backoffMs: [200], checkEveryMs: 2 });
    p.live.delete(first);
    await new Promise((r) => setTimeout(r, 30));
    await s.stop();
    await new Promise((r) => setTimeout(r, 250));
    expect(p.started).toEqual([]);
    expect(await s.done).toBe('stopped');
  });
});

// Signs the fake's events as the payments provider signs webhooks and delivers them, in order,
// retrying a failed delivery a few times with growing delays.
import { createHmac } from 'node:crypto';
import type { WebhookDelivery, WireObject } from './store';

/**
 * The `Stripe-Signature` header: `t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<payload>">`, keyed
 * with the whole signing secret (whsec_…). Source: Stripe documentation: webhook signatures
 * (verifying signatures manually).
 */
export function signatureHeader(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

/** Receives a delivery in-process (e.g. through supertest) instead of over HTTP; answers the status code. */
export type WebhookReceiver = (payload: string, headers: Record<string, string>) => Promise<number>;
export type WebhookTarget = string | WebhookReceiver;

export interface WebhookSenderOptions {
  secret: string;
  /** Waits before each retry; the number of entries is the number of retries. */
  retryDelaysMs: readonly number[];
  timeoutMs: number;
  log: (line: string) => void;
  /** Called whenever a delivery's record changes, so the state file follows. */
  changed: () => void;
}

export function createWebhookSender(options: WebhookSenderOptions) {
  let target: WebhookTarget | null = null;
  let chain = Promise.resolve();
  const inFlight = new Set<Promise<unknown>>();
  // pending retries, each with the function that settles its tracked promise
  const timers = new Map<NodeJS.Timeout, () => void>();
  let closed = false;

  const track = <T>(p: Promise<T>): Promise<T> => {
    inFlight.add(p);
    void p.finally(() => inFlight.delete(p));
    return p;
  };

  async function attempt(event: WireObject, delivery: WebhookDelivery, to: WebhookTarget): Promise<boolean> {
    // the payload is signed as sent, byte for byte; pretty-printed like the provider's
    const payload = JSON.stringify(event, null, 2);
    const headers = {
      'content-type': 'application/json; charset=utf-8',
      'stripe-signature': signatureHeader(payload, options.secret),
      'user-agent': 'emberline-payments-fake/1.0',
    };
    delivery.attempts += 1;
    try {
      let status: number;
      if (typeof to === 'string') {
        const res = await fetch(to, { method: 'POST', headers, body: payload, signal: AbortSignal.timeout(options.timeoutMs), redirect: 'manual' });
        status = res.status;
        await res.arrayBuffer().catch(() => undefined);
      } else {
        status = await to(payload, headers);
      }
      delivery.lastStatus = status;
      delivery.lastError = status >= 200 && status < 300 ? null : `answered HTTP ${status}`;
    } catch (err) {
      delivery.lastStatus = null;
      delivery.lastError = (err as Error).message;
    }
    const ok = delivery.lastError === null;
    options.log(`webhook ${event.type as string} ${event.id} → ${typeof to === 'string' ? to : 'in-process receiver'}: ${ok ? 'delivered' : delivery.lastError} (attempt ${delivery.attempts})`);
    return ok;
  }

  function retry(event: WireObject, delivery: WebhookDelivery, to: WebhookTarget, retryIndex: number) {
    const delay = options.retryDelaysMs[retryIndex];
    if (delay === undefined || closed) {
      delivery.status = 'failed';
      options.changed();
      return;
    }
    let done!: () => void;
    track(new Promise<void>((resolve) => (done = resolve)));
    const timer = setTimeout(() => {
      timers.delete(timer);
      void attempt(event, delivery, to)
        .then((ok) => {
          if (ok) delivery.status = 'delivered';
          else retry(event, delivery, to, retryIndex + 1);
          options.changed();
        })
        .finally(done);
    }, delay);
    timers.set(timer, done);
  }

  return {
    target: () => target,
    setTarget(next: WebhookTarget | null) {
      target = next;
    },
    /** Queues the event; answers the delivery record, or null when no endpoint is configured. */
    send(event: WireObject): WebhookDelivery | null {
      const to = target;
      if (!to || closed) return null;
      const delivery: WebhookDelivery = {
        eventId: event.id,
        type: String(event.type),
        url: typeof to === 'string' ? to : 'in-process receiver',
        attempts: 0,
        status: 'pending',
        lastStatus: null,
        lastError: null,
      };
      // first attempts go one after another, in the order the events happened; a failed one
      // is retried on its own timer so that it does not hold the others back
      chain = chain
        .then(() =>
          attempt(event, delivery, to).then((ok) => {
            if (ok) delivery.status = 'delivered';
            else retry(event, delivery, to, 0);
            options.changed();
          }),
        )
        // one broken delivery must never stop the ones queued behind it
        .catch((err: unknown) => options.log(`webhook ${event.id}: ${(err as Error).message}`));
      track(chain);
      return delivery;
    },
    /** Resolves once every queued delivery and retry has finished. */
    async idle(): Promise<void> {
      while (inFlight.size > 0) await Promise.allSettled([...inFlight]);
    },
    close() {
      closed = true;
      for (const [timer, done] of timers) {
        clearTimeout(timer);
        done();
      }
      timers.clear();
    },
  };
}

export type WebhookSender = ReturnType<typeof createWebhookSender>;

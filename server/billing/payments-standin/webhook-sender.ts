import { createHmac } from 'node:crypto';

/** The payments service's signature header: t=<unix seconds>,v1=<hex HMAC-SHA256 of "t.payload" with the endpoint secret>. */
export function signatureHeader(payload: string, secret: string, timestamp = Math.floor(Date.now() / 1000)): string {
  const signature = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${signature}`;
}

export interface DeliveryAttempt {
  eventId: string;
  type: string;
  attempt: number;
  /** HTTP status, or 0 when the endpoint could not be reached. */
  status: number;
  at: Date;
}

interface Pending {
  eventId: string;
  type: string;
  payload: string;
  attempts: number;
  nextAt: number;
}

export interface WebhookSenderOptions {
  url: string | null;
  secret: string;
  /** Waits before each retry, in ms; when used up, the delivery is dropped. */
  retryDelaysMs: number[];
  timeoutMs?: number;
}

/**
 * Delivers events to one endpoint, one at a time in the order they were made, signed; an answer
 * other than 2xx (or none) is retried later with growing waits, while later events go ahead.
 */
export class WebhookSender {
  readonly attempts: DeliveryAttempt[] = [];
  private readonly queue: Pending[] = [];
  private running = false;
  private paused = false;
  private timer: NodeJS.Timeout | null = null;
  private idleWaiters: (() => void)[] = [];
  private closed = false;

  constructor(private readonly options: WebhookSenderOptions) {}

  /** Points deliveries (those waiting included) at another endpoint. */
  setUrl(url: string | null): void {
    this.options.url = url;
    this.kick();
  }

  enqueue(event: { id: string; type: string }, payload: string): void {
    if (!this.options.url || this.closed) return;
    this.queue.push({ eventId: event.id, type: event.type, payload, attempts: 0, nextAt: Date.now() });
    this.kick();
  }

  /** Holds deliveries (events keep queueing) until resume(). */
  pause(): void {
    this.paused = true;
  }

  resume(): void {
    this.paused = false;
    this.kick();
  }

  /** Events still waiting for a successful delivery. */
  pending(): { eventId: string; type: string; attempts: number }[] {
    return this.queue.map(({ eventId, type, attempts }) => ({ eventId, type, attempts }));
  }

  /** Resolves when nothing is waiting (every event delivered or given up). */
  idle(): Promise<void> {
    if (!this.queue.length && !this.running) return Promise.resolve();
    return new Promise((resolve) => this.idleWaiters.push(resolve));
  }

  /** Sends one signed payload now, outside the queue; answers the endpoint's status (0 when unreachable). */
  async send(eventId: string, type: string, payload: string, attempt = 1): Promise<number> {
    if (!this.options.url) return 0;
    let status = 0;
    try {
      const response = await fetch(this.options.url, {
        method: 'POST',
        headers: { 'content-type': 'application/json; charset=utf-8', 'stripe-signature': signatureHeader(payload, this.options.secret), 'user-agent': 'PaymentsStandIn/1.0' },
        body: payload,
        signal: AbortSignal.timeout(this.options.timeoutMs ?? 10_000),
      });
      status = response.status;
      await response.arrayBuffer().catch(() => undefined);
    } catch {
      status = 0;
    }
    this.attempts.push({ eventId, type, attempt, status, at: new Date() });
    return status;
  }

  close(): void {
    this.closed = true;
    if (this.timer) clearTimeout(this.timer);
    this.queue.length = 0;
    this.settle();
  }

  private settle(): void {
    if (this.queue.length || this.running) return;
    const waiters = this.idleWaiters;
    this.idleWaiters = [];
    for (const resolve of waiters) resolve();
  }

  private kick(): void {
    if (this.running || this.paused || this.closed) return;
    if (this.timer) {
      clearTimeout(this.timer);
      this.timer = null;
    }
    void this.drain();
  }

  private async drain(): Promise<void> {
    this.running = true;
    try {
      while (!this.paused && !this.closed) {
        const now = Date.now();
        const next = this.queue.find((p) => p.nextAt <= now);
        if (!next) break;
        next.attempts += 1;
        const status = await this.send(next.eventId, next.type, next.payload, next.attempts);
        if (status >= 200 && status < 300) {
          this.queue.splice(this.queue.indexOf(next), 1);
        } else {
          const wait = this.options.retryDelaysMs[next.attempts - 1];
          if (wait === undefined) this.queue.splice(this.queue.indexOf(next), 1);
          else next.nextAt = Date.now() + wait;
        }
      }
    } finally {
      this.running = false;
    }
    if (!this.paused && !this.closed && this.queue.length) {
      const soonest = Math.min(...this.queue.map((p) => p.nextAt));
      this.timer = setTimeout(() => this.kick(), Math.max(0, soonest - Date.now()));
      this.timer.unref();
    }
    this.settle();
  }
}

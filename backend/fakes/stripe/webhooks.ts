// Signed webhook delivery in the processor's published scheme (shared/REFERENCE-VALUES.md, "Payment
// webhooks"): `Stripe-Signature: t=<unix seconds>,v1=<hex HMAC-SHA256 of "<t>.<raw body>">`, keyed with the
// whole whsec_… endpoint secret (stripe-node Webhooks.ts, published). A non-2xx answer or a connection
// error is retried with exponential back-off; for tests each event can be sent several times and a batch
// in a seeded random order.
import { createHmac } from 'node:crypto';
import { newId, seededRandom, shuffleInPlace } from './ids';
import type { FakeEvent } from './types';

/** The Stripe-Signature header for a payload signed at `timestamp` (unix seconds). */
export function signatureHeader(payload: string, secret: string, timestamp: number): string {
  const v1 = createHmac('sha256', secret).update(`${timestamp}.${payload}`, 'utf8').digest('hex');
  return `t=${timestamp},v1=${v1}`;
}

export interface DeliverySettings {
  webhookUrl: string | null;
  webhookSecret: string;
  /** Copies of each event sent (1 = each once). */
  duplicate: number;
  /** Deliver each batch of queued deliveries in a seeded random order. */
  shuffle: boolean;
  seed: number;
  /** Delay before retry n is retryBaseMs × 2^(n−1). */
  retryBaseMs: number;
  /** Attempts per delivery, the first one included. */
  maxAttempts: number;
  /** Deliveries in flight at once (1 = one after another, in order). */
  concurrency: number;
  /** Time allowed for the receiver to answer one attempt. */
  timeoutMs: number;
  paused: boolean;
}

export interface DeliveryAttempt {
  /** One id per queued delivery (a duplicate copy has its own). */
  deliveryId: string;
  eventId: string;
  eventType: string;
  copy: number;
  attempt: number;
  url: string;
  /** Unix milliseconds when the attempt was sent. */
  at: number;
  durationMs: number;
  /** The receiver's HTTP status, or null when there was no answer. */
  status: number | null;
  ok: boolean;
  error?: string;
  /** What happens next: done, a retry at retryAt, or given up after maxAttempts. */
  outcome: 'delivered' | 'retry' | 'gave_up' | 'no_endpoint';
  retryAt?: number;
}

export interface FlushResult {
  /** Deliveries answered with a 2xx during the flush. */
  delivered: number;
  /** Deliveries given up after maxAttempts during the flush. */
  failed: number;
  /** HTTP attempts made during the flush, retries included. */
  attempts: number;
  /** Deliveries still queued (non-zero only when the flush timed out). */
  pending: number;
}

interface Job {
  deliveryId: string;
  event: FakeEvent;
  body: string;
  copy: number;
  attempt: number;
  dueAt: number;
}

export class Deliverer {
  private queue: Job[] = [];
  private inFlight = 0;
  private running: Promise<void> | null = null;
  private timer: NodeJS.Timeout | null = null;
  private flushing = 0;
  private closed = false;
  /** Bumped by clear(): deliveries of an older generation still in a round are dropped. */
  private generation = 0;
  private random: () => number;
  readonly log: DeliveryAttempt[] = [];
  /** Events whose every copy was given up, for redelivery. */
  readonly gaveUp = new Set<string>();
  private totals = { delivered: 0, failed: 0, attempts: 0 };

  constructor(
    private readonly settings: () => DeliverySettings,
    private readonly now: () => number,
    private readonly onDelivered: (event: FakeEvent) => void,
    private readonly report: (line: string) => void = () => {},
  ) {
    this.random = seededRandom(settings().seed);
  }

  reseed(seed: number): void {
    this.random = seededRandom(seed);
  }

  get pending(): number {
    return this.queue.length + this.inFlight;
  }

  /** Queues an event (as many copies as the duplicate setting says) if an endpoint is configured. */
  enqueue(event: FakeEvent): boolean {
    const s = this.settings();
    if (!s.webhookUrl) return false;
    const body = JSON.stringify(event, null, 2);
    for (let copy = 1; copy <= Math.max(1, s.duplicate); copy++)
      this.queue.push({ deliveryId: newId('whd'), event, body, copy, attempt: 0, dueAt: Date.now() });
    this.soon(0);
    return true;
  }

  /** Queues events again (after they were given up, or on purpose), one copy each. */
  redeliver(events: FakeEvent[]): number {
    for (const event of events) {
      this.gaveUp.delete(event.id);
      this.queue.push({
        deliveryId: newId('whd'),
        event,
        body: JSON.stringify(event, null, 2),
        copy: 1,
        attempt: 0,
        dueAt: Date.now(),
      });
    }
    this.soon(0);
    return events.length;
  }

  /** Delivers everything queued now — even while paused — waiting out retry delays until the queue is empty. */
  async flush(timeoutMs = 60_000): Promise<FlushResult> {
    const before = { ...this.totals };
    const deadline = Date.now() + timeoutMs;
    this.flushing++;
    try {
      for (;;) {
        if (this.closed) break;
        this.kick();
        if (this.running) await this.running;
        if (this.queue.length === 0 && this.inFlight === 0) break;
        const nextDue = this.nextDue();
        const wait = Math.max(0, nextDue - Date.now());
        if (Date.now() + wait > deadline) break;
        await new Promise((r) => setTimeout(r, wait));
      }
    } finally {
      this.flushing--;
    }
    return {
      delivered: this.totals.delivered - before.delivered,
      failed: this.totals.failed - before.failed,
      attempts: this.totals.attempts - before.attempts,
      pending: this.pending,
    };
  }

  /** Settings changed (pause lifted, new endpoint): look at the queue again. */
  wake(): void {
    this.soon(0);
  }

  /** Forgets queued deliveries and the log; waits for an attempt already on the wire to end. */
  async clear(): Promise<void> {
    this.generation++;
    this.queue = [];
    if (this.running) await this.running;
    this.queue = [];
    this.log.length = 0;
    this.gaveUp.clear();
    this.totals = { delivered: 0, failed: 0, attempts: 0 };
  }

  async close(): Promise<void> {
    this.closed = true;
    if (this.timer) clearTimeout(this.timer);
    this.timer = null;
    this.queue = [];
    if (this.running) await this.running;
  }

  private nextDue(): number {
    return this.queue.reduce((min, j) => Math.min(min, j.dueAt), Infinity);
  }

  private soon(delayMs: number): void {
    if (this.closed) return;
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = null;
      this.kick();
    }, delayMs);
    this.timer.unref();
  }

  private kick(): void {
    if (this.running || this.closed) return;
    this.running = this.run().finally(() => {
      this.running = null;
      this.scheduleNext();
    });
  }

  private scheduleNext(): void {
    if (this.closed || this.queue.length === 0) return;
    if (this.settings().paused && this.flushing === 0) return;
    const nextDue = this.nextDue();
    this.soon(Math.max(0, nextDue - Date.now()));
  }

  /** Rounds of due deliveries until none is due: each round in order (or shuffled), `concurrency` at a time. */
  private async run(): Promise<void> {
    for (;;) {
      const s = this.settings();
      if (this.closed || (s.paused && this.flushing === 0)) return;
      const now = Date.now();
      const due = this.queue.filter((j) => j.dueAt <= now);
      if (due.length === 0) return;
      this.queue = this.queue.filter((j) => j.dueAt > now);
      if (s.shuffle) shuffleInPlace(due, this.random);
      let next = 0;
      const generation = this.generation;
      const worker = async () => {
        while (next < due.length && !this.closed && generation === this.generation) {
          const job = due[next++];
          this.inFlight++;
          try {
            await this.attempt(job);
          } finally {
            this.inFlight--;
          }
        }
      };
      await Promise.all(Array.from({ length: Math.max(1, Math.min(s.concurrency, due.length)) }, worker));
    }
  }

  private async attempt(job: Job): Promise<void> {
    const s = this.settings();
    const generation = this.generation;
    job.attempt++;
    const at = Date.now();
    const base = {
      deliveryId: job.deliveryId,
      eventId: job.event.id,
      eventType: job.event.type,
      copy: job.copy,
      attempt: job.attempt,
      url: s.webhookUrl ?? '',
      at,
    };
    if (!s.webhookUrl) {
      this.log.push({ ...base, durationMs: 0, status: null, ok: false, outcome: 'no_endpoint' });
      return;
    }
    const timestamp = this.now();
    let status: number | null = null;
    let error: string | undefined;
    try {
      const res = await fetch(s.webhookUrl, {
        method: 'POST',
        headers: {
          'Content-Type': 'application/json; charset=utf-8',
          'Stripe-Signature': signatureHeader(job.body, s.webhookSecret, timestamp),
          'User-Agent': 'Loambook-local-card-processor-fake/1.0',
        },
        body: job.body,
        signal: AbortSignal.timeout(s.timeoutMs),
      });
      status = res.status;
      await res.arrayBuffer();
    } catch (err) {
      error =
        err instanceof Error ? (err.cause instanceof Error ? err.cause.message : err.message) : String(err);
    }
    if (generation !== this.generation) return; // reset while this attempt was on the wire
    this.totals.attempts++;
    const ok = status !== null && status >= 200 && status < 300;
    const durationMs = Date.now() - at;
    if (ok) {
      this.totals.delivered++;
      this.onDelivered(job.event);
      this.log.push({ ...base, durationMs, status, ok, outcome: 'delivered' });
      this.report(`webhook ${job.event.type} ${job.event.id} → ${status}`);
    } else if (this.closed) {
      return;
    } else if (job.attempt >= s.maxAttempts) {
      this.totals.failed++;
      this.gaveUp.add(job.event.id);
      this.log.push({ ...base, durationMs, status, ok, error, outcome: 'gave_up' });
      this.report(
        `webhook ${job.event.type} ${job.event.id} → ${status ?? error}; gave up after ${job.attempt} attempts`,
      );
    } else {
      job.dueAt = Date.now() + s.retryBaseMs * 2 ** (job.attempt - 1);
      this.queue.push(job);
      this.log.push({ ...base, durationMs, status, ok, error, outcome: 'retry', retryAt: job.dueAt });
      this.report(
        `webhook ${job.event.type} ${job.event.id} → ${status ?? error}; retry ${job.attempt + 1} at +${job.dueAt - Date.now()} ms`,
      );
    }
  }
}

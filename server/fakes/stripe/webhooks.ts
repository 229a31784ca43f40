/**
 * Events and their delivery: each event is recorded when raised, then POSTed to the webhook
 * URL with a `Stripe-Signature` header made exactly as Stripe makes it. Deliveries go out one
 * at a time in the order the events were raised; a failed one is retried a few times.
 */
import Stripe from 'stripe';
import type { EventDraft } from './billing';
import type { Clock } from './clock';
import { newId } from './ids';
import type { StripeEvent } from './objects';

export interface DeliveryRecord {
  /** not_sent: the stand-in had no webhook URL when the event was raised */
  status: 'pending' | 'delivered' | 'failed' | 'not_sent';
  url: string | null;
  attempts: number;
  /** the receiver's last HTTP status, if it answered */
  responseStatus: number | null;
  error: string | null;
}

export interface StripeEventRecord {
  event: StripeEvent;
  delivery: DeliveryRecord;
}

export interface WebhookSenderOptions {
  url: string | null;
  secret: string;
  clock: Clock;
  /** retries after the first attempt (default 3) */
  maxRetries?: number;
  retryDelayMs?: number;
  timeoutMs?: number;
}

export class WebhookSender {
  private readonly records: StripeEventRecord[] = [];
  private queue: Promise<void> = Promise.resolve();
  private url: string | null;
  private readonly stopping = new AbortController();

  constructor(private readonly options: WebhookSenderOptions) {
    this.url = options.url;
  }

  setUrl(url: string | null): void {
    this.url = url;
  }

  events(): readonly StripeEventRecord[] {
    return [...this.records];
  }

  /**
   * Records the events now and queues their delivery behind any earlier ones. The promise
   * settles when these events are delivered or given up on; it never rejects.
   */
  publish(
    drafts: readonly EventDraft[],
    request: { id: string | null; idempotencyKey: string | null } = { id: null, idempotencyKey: null },
  ): Promise<void> {
    if (drafts.length === 0) return this.queue;
    const url = this.url;
    const batch = drafts.map((d) => {
      const event: StripeEvent = {
        id: newId('evt_'),
        object: 'event',
        api_version: Stripe.API_VERSION,
        created: this.options.clock.unix(),
        data: { object: d.object, ...(d.previousAttributes ? { previous_attributes: d.previousAttributes } : {}) },
        livemode: false,
        pending_webhooks: 1,
        request: { id: request.id, idempotency_key: request.idempotencyKey },
        type: d.type,
      };
      const record: StripeEventRecord = {
        event,
        delivery: { status: url ? 'pending' : 'not_sent', url, attempts: 0, responseStatus: null, error: null },
      };
      this.records.push(record);
      return record;
    });
    if (!url) return this.queue;
    const delivered = this.queue.then(async () => {
      for (const record of batch) await this.deliver(record, url);
    });
    this.queue = delivered;
    return delivered;
  }

  /** settles once every queued delivery has finished */
  idle(): Promise<void> {
    return this.queue;
  }

  /** Gives up on deliveries still queued or under way (they are recorded as failed). */
  async stop(): Promise<void> {
    this.stopping.abort();
    await this.queue;
  }

  private async deliver(record: StripeEventRecord, url: string): Promise<void> {
    const payload = JSON.stringify(record.event, null, 2);
    const maxAttempts = 1 + (this.options.maxRetries ?? 3);
    const { delivery } = record;
    while (delivery.attempts < maxAttempts && !this.stopping.signal.aborted) {
      if (delivery.attempts > 0) await sleep(this.options.retryDelayMs ?? 200);
      if (this.stopping.signal.aborted) break;
      delivery.attempts += 1;
      try {
        // Signed per attempt, as Stripe does: the timestamp is the time of sending.
        const signature = Stripe.webhooks.generateTestHeaderString({ payload, secret: this.options.secret });
        const res = await fetch(url, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json; charset=utf-8', 'Stripe-Signature': signature, 'User-Agent': 'Mullion-Stripe-Stand-In/1.0' },
          body: payload,
          signal: AbortSignal.any([AbortSignal.timeout(this.options.timeoutMs ?? 10_000), this.stopping.signal]),
        });
        await res.arrayBuffer().catch(() => undefined);
        delivery.responseStatus = res.status;
        if (res.ok) {
          delivery.status = 'delivered';
          delivery.error = null;
          return;
        }
        delivery.error = `The receiver answered ${res.status}.`;
      } catch (err) {
        delivery.responseStatus = null;
        delivery.error = err instanceof Error ? err.message : String(err);
      }
    }
    if (this.stopping.signal.aborted && delivery.attempts < maxAttempts) delivery.error = 'The stand-in stopped before this event was delivered.';
    delivery.status = 'failed';
  }
}

function sleep(ms: number): Promise<void> {
  return new Promise((resolve) => setTimeout(resolve, ms));
}

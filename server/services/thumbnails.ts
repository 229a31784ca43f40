/**
 * Thumbnails made off the request path: a small pool of worker threads (node:worker_threads)
 * running thumbnail-worker.mjs, so decoding a large photo never blocks the event loop — other
 * requests, `/api/health` included, keep being answered while it runs.
 *
 * Workers start on first use, one job each at a time; further jobs wait in a bounded queue.
 * `close()` terminates them (server shutdown, test teardown).
 */
import { EventEmitter } from 'node:events';
import { Worker } from 'node:worker_threads';

/** The worker is plain JavaScript: Node loads it the same under tsx and under Vitest. */
const WORKER_URL = new URL('./thumbnail-worker.mjs', import.meta.url);

/** The image could not be decoded (it is not the image its header claims). */
export class ThumbnailDecodeError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ThumbnailDecodeError';
  }
}

/** No thumbnail can be made now: the queue is full, or the pool is shutting down. */
export class ThumbnailUnavailableError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ThumbnailUnavailableError';
  }
}

export interface ThumbnailOptions {
  /** the thumbnail's largest width in pixels; a narrower image keeps its size */
  width: number;
  /** JPEG quality, 1–100 */
  quality: number;
}

export interface Thumbnailer {
  /** A JPEG thumbnail of a PNG or JPEG; rejects with ThumbnailDecodeError or ThumbnailUnavailableError. */
  make(data: Buffer, options: ThumbnailOptions): Promise<Buffer>;
  /** `started` and `finished` (with `{ id }`) as each job enters and leaves a worker. */
  readonly events: EventEmitter;
  close(): Promise<void>;
}

interface Job {
  id: number;
  data: Buffer;
  options: ThumbnailOptions;
  resolve: (jpeg: Buffer) => void;
  reject: (err: Error) => void;
}

interface Slot {
  worker: Worker;
  job: Job | null;
}

type WorkerReply = { id: number; ok: true; data: Uint8Array } | { id: number; ok: false; message: string };

export interface ThumbnailPoolOptions {
  /** worker threads at most (default 1: the decode is CPU-bound and the host is small) */
  workers?: number;
  /** jobs that may wait for a worker before new ones are refused (default 20) */
  maxQueued?: number;
}

export function createThumbnailPool(options: ThumbnailPoolOptions = {}): Thumbnailer {
  const size = Math.max(1, options.workers ?? 1);
  const maxQueued = options.maxQueued ?? 20;
  const events = new EventEmitter();
  const slots: Slot[] = [];
  const queue: Job[] = [];
  let nextId = 1;
  let closed = false;

  function spawn(): Slot {
    const worker = new Worker(WORKER_URL);
    worker.unref(); // an idle pool never keeps the process alive
    const slot: Slot = { worker, job: null };
    worker.on('message', (reply: WorkerReply) => {
      const job = slot.job;
      if (!job || job.id !== reply.id) return;
      slot.job = null;
      events.emit('finished', { id: job.id });
      if (reply.ok) job.resolve(Buffer.from(reply.data.buffer, reply.data.byteOffset, reply.data.byteLength));
      else job.reject(new ThumbnailDecodeError(reply.message));
      pump();
    });
    const lost = (why: string) => {
      const index = slots.indexOf(slot);
      if (index >= 0) slots.splice(index, 1);
      const job = slot.job;
      slot.job = null;
      if (job) {
        events.emit('finished', { id: job.id });
        job.reject(closed ? new ThumbnailUnavailableError('The server is shutting down.') : new ThumbnailDecodeError(why));
      }
      if (!closed) pump();
    };
    worker.on('error', (err) => lost(err.message));
    worker.on('exit', (code) => lost(`The thumbnail worker stopped (exit code ${code}).`));
    slots.push(slot);
    return slot;
  }

  function pump(): void {
    while (!closed && queue.length > 0) {
      const slot = slots.find((s) => s.job === null) ?? (slots.length < size ? spawn() : null);
      if (!slot) return;
      const job = queue.shift()!;
      slot.job = job;
      slot.worker.ref(); // a job in progress keeps the process alive until it answers
      events.emit('started', { id: job.id });
      // a copy goes to the worker: the caller still stores the original bytes
      slot.worker.postMessage({ id: job.id, data: new Uint8Array(job.data), width: job.options.width, quality: job.options.quality });
    }
    for (const slot of slots) if (slot.job === null) slot.worker.unref();
  }

  return {
    events,
    make(data, opts) {
      if (closed) return Promise.reject(new ThumbnailUnavailableError('The server is shutting down.'));
      if (queue.length >= maxQueued) return Promise.reject(new ThumbnailUnavailableError('Too many photos are being processed.'));
      return new Promise<Buffer>((resolve, reject) => {
        queue.push({ id: nextId++, data, options: opts, resolve, reject });
        pump();
      });
    },
    async close() {
      closed = true;
      for (const job of queue.splice(0)) job.reject(new ThumbnailUnavailableError('The server is shutting down.'));
      await Promise.all(slots.map((s) => s.worker.terminate()));
    },
  };
}

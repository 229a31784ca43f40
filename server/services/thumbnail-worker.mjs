// The thumbnail worker: decodes a PNG or JPEG with jimp and answers a JPEG at most `width`
// pixels wide, off the server's event loop. Plain JavaScript on purpose, so Node loads it the
// same way under tsx (npm start) and under Vitest (tests import the app), with no TypeScript
// loader in the worker. Started and fed by thumbnails.ts; one job at a time.
import { Buffer } from 'node:buffer';
import { parentPort } from 'node:worker_threads';
import { Jimp } from 'jimp';

if (!parentPort) throw new Error('thumbnail-worker.mjs runs as a worker thread only.');
const port = parentPort;

port.on('message', (job) => {
  void (async () => {
    try {
      const image = await Jimp.read(Buffer.from(job.data.buffer, job.data.byteOffset, job.data.byteLength));
      if (image.width > job.width) image.resize({ w: job.width });
      const jpeg = await image.getBuffer('image/jpeg', { quality: job.quality });
      port.postMessage({ id: job.id, ok: true, data: new Uint8Array(jpeg) });
    } catch (err) {
      port.postMessage({ id: job.id, ok: false, message: err instanceof Error ? err.message : String(err) });
    }
  })();
});

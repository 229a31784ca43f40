/**
 * Draws an invented floor plan as a PNG at seed time (no image library): rooms as filled
 * rectangles with walls, windows as double marks on outside walls, doors as gaps.
 * The PNG is written with node:zlib (deflate + CRC-32 per the PNG specification).
 */
import zlib from 'node:zlib';

type Rgb = [number, number, number];

export interface PlanRoom {
  x: number;
  y: number;
  w: number;
  h: number;
  fill: Rgb;
}
export interface PlanMark {
  /** a window or door on a wall: from (x1,y1) to (x2,y2) along the wall */
  x1: number;
  y1: number;
  x2: number;
  y2: number;
  kind: 'window' | 'door';
}

const INK: Rgb = [29, 42, 48];
const PAPER: Rgb = [246, 244, 239];
const GLASS: Rgb = [93, 107, 115];

class Canvas {
  readonly data: Buffer;
  constructor(
    readonly width: number,
    readonly height: number,
  ) {
    this.data = Buffer.alloc(width * height * 3);
    this.fill(0, 0, width, height, PAPER);
  }
  fill(x: number, y: number, w: number, h: number, [r, g, b]: Rgb): void {
    for (let yy = Math.max(0, y); yy < Math.min(this.height, y + h); yy++)
      for (let xx = Math.max(0, x); xx < Math.min(this.width, x + w); xx++) {
        const i = (yy * this.width + xx) * 3;
        this.data[i] = r;
        this.data[i + 1] = g;
        this.data[i + 2] = b;
      }
  }
  outline(x: number, y: number, w: number, h: number, t: number, colour: Rgb): void {
    this.fill(x, y, w, t, colour);
    this.fill(x, y + h - t, w, t, colour);
    this.fill(x, y, t, h, colour);
    this.fill(x + w - t, y, t, h, colour);
  }
  png(): Buffer {
    const raw = Buffer.alloc((this.width * 3 + 1) * this.height);
    for (let y = 0; y < this.height; y++) {
      raw[y * (this.width * 3 + 1)] = 0; // filter: none
      this.data.copy(raw, y * (this.width * 3 + 1) + 1, y * this.width * 3, (y + 1) * this.width * 3);
    }
    const header = Buffer.alloc(13);
    header.writeUInt32BE(this.width, 0);
    header.writeUInt32BE(this.height, 4);
    header[8] = 8; // bit depth
    header[9] = 2; // colour type: truecolour
    return Buffer.concat([
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
      chunk('IHDR', header),
      chunk('IDAT', zlib.deflateSync(raw)),
      chunk('IEND', Buffer.alloc(0)),
    ]);
  }
}

function chunk(type: string, body: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(body.length);
  const typed = Buffer.concat([Buffer.from(type, 'ascii'), body]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(typed) >>> 0);
  return Buffer.concat([length, typed, crc]);
}

/** A plan image of the given rooms and wall marks. */
export function drawPlan(width: number, height: number, rooms: readonly PlanRoom[], marks: readonly PlanMark[]): Buffer {
  const c = new Canvas(width, height);
  for (const r of rooms) c.fill(r.x, r.y, r.w, r.h, r.fill);
  for (const r of rooms) c.outline(r.x, r.y, r.w, r.h, 4, INK);
  for (const m of marks) {
    const horizontal = m.y1 === m.y2;
    const x = Math.min(m.x1, m.x2);
    const y = Math.min(m.y1, m.y2);
    const len = horizontal ? Math.abs(m.x2 - m.x1) : Math.abs(m.y2 - m.y1);
    if (m.kind === 'door') {
      // a gap in the wall
      if (horizontal) c.fill(x, y - 2, len, 8, PAPER);
      else c.fill(x - 2, y, 8, len, PAPER);
    } else if (horizontal) {
      c.fill(x, y - 3, len, 10, PAPER);
      c.fill(x, y - 3, len, 2, GLASS);
      c.fill(x, y + 5, len, 2, GLASS);
    } else {
      c.fill(x - 3, y, 10, len, PAPER);
      c.fill(x - 3, y, 2, len, GLASS);
      c.fill(x + 5, y, 2, len, GLASS);
    }
  }
  return c.png();
}

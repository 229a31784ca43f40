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

/** "#2f5d7c" → [47, 93, 124] */
function rgbOf(hex: string): Rgb {
  const n = Number.parseInt(hex.replace('#', ''), 16);
  return [(n >> 16) & 255, (n >> 8) & 255, n & 255];
}

/**
 * An invented firm emblem for the demo, drawn from simple shapes in the firm's accent colour:
 * `lantern` (a lantern with four panes) or `vale` (rolling hills under a sun).
 */
export function drawEmblem(accentHex: string, kind: 'lantern' | 'vale', size = 96): Buffer {
  const c = new Canvas(size, size);
  const accent = rgbOf(accentHex);
  const white: Rgb = [255, 255, 255];
  c.fill(0, 0, size, size, white);
  const u = size / 12;
  c.fill(Math.round(u), Math.round(u), Math.round(10 * u), Math.round(10 * u), accent);
  if (kind === 'lantern') {
    c.fill(Math.round(5 * u), Math.round(2 * u), Math.round(2 * u), Math.round(u), white); // handle
    c.fill(Math.round(3.5 * u), Math.round(3 * u), Math.round(5 * u), Math.round(0.8 * u), white); // cap
    c.outline(Math.round(4 * u), Math.round(4 * u), Math.round(4 * u), Math.round(5 * u), Math.max(2, Math.round(0.5 * u)), white); // frame
    c.fill(Math.round(5.8 * u), Math.round(4 * u), Math.max(2, Math.round(0.4 * u)), Math.round(5 * u), white); // mullion
    c.fill(Math.round(4 * u), Math.round(6.3 * u), Math.round(4 * u), Math.max(2, Math.round(0.4 * u)), white); // transom
    c.fill(Math.round(3.5 * u), Math.round(9 * u), Math.round(5 * u), Math.round(0.8 * u), white); // base
  } else {
    for (let y = 0; y < size; y++)
      for (let x = 0; x < size; x++) {
        const inside = x >= u && x < 11 * u && y >= u && y < 11 * u;
        if (!inside) continue;
        const hill1 = y > 7.5 * u + 1.6 * u * Math.cos(((x - 4 * u) / (6 * u)) * Math.PI);
        const hill2 = y > 8.6 * u + 1.2 * u * Math.cos(((x - 8.5 * u) / (5 * u)) * Math.PI);
        const sun = (x - 7.8 * u) ** 2 + (y - 4.2 * u) ** 2 < (1.4 * u) ** 2;
        if (hill1 || hill2 || sun) c.fill(x, y, 1, 1, white);
      }
  }
  return c.png();
}

/**
 * Small image files built byte by byte for upload tests: headers that claim any size (a
 * decompression bomb's header costs a few dozen bytes), and a real PNG to decode.
 */
import zlib from 'node:zlib';

function chunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(zlib.crc32(body));
  return Buffer.concat([length, body, crc]);
}

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function ihdr(width: number, height: number): Buffer {
  const data = Buffer.alloc(13);
  data.writeUInt32BE(width, 0);
  data.writeUInt32BE(height, 4);
  data[8] = 8; // bit depth
  data[9] = 2; // colour type: RGB
  return chunk('IHDR', data);
}

/** A PNG whose header (IHDR, CRC correct) claims width × height, with one tiny IDAT: never decodable at that size. */
export function pngClaiming(width: number, height: number): Buffer {
  return Buffer.concat([PNG_SIGNATURE, ihdr(width, height), chunk('IDAT', zlib.deflateSync(Buffer.alloc(16))), chunk('IEND', Buffer.alloc(0))]);
}

/**
 * A real, decodable PNG of width × height grey pixels: rows of zeros compressed with zlib, so
 * a large image is a small file that takes the decoder real work (built in milliseconds here).
 */
export function solidPng(width: number, height: number): Buffer {
  const raw = Buffer.alloc(height * (1 + width * 3), 0x80);
  for (let y = 0; y < height; y++) raw[y * (1 + width * 3)] = 0; // filter type: none
  return Buffer.concat([PNG_SIGNATURE, ihdr(width, height), chunk('IDAT', zlib.deflateSync(raw)), chunk('IEND', Buffer.alloc(0))]);
}

/** A lossless WebP header (VP8L) claiming width × height; enough for the header check, not for a decoder. */
export function webpClaiming(width: number, height: number): Buffer {
  const bits = ((width - 1) & 0x3fff) | (((height - 1) & 0x3fff) << 14);
  const vp8l = Buffer.alloc(5 + 16);
  vp8l[0] = 0x2f;
  vp8l.writeUInt32LE(bits >>> 0, 1);
  const payload = Buffer.concat([Buffer.from('VP8L'), Buffer.from([vp8l.length, 0, 0, 0]), vp8l]);
  const riffSize = Buffer.alloc(4);
  riffSize.writeUInt32LE(4 + payload.length);
  return Buffer.concat([Buffer.from('RIFF'), riffSize, Buffer.from('WEBP'), payload]);
}

/** A JPEG header (JFIF, then a baseline frame header claiming width × height); enough for the header check, not for a decoder. */
export function jpegClaiming(width: number, height: number): Buffer {
  const app0 = Buffer.concat([Buffer.from([0xff, 0xe0, 0x00, 0x10]), Buffer.from('JFIF\0', 'latin1'), Buffer.from([1, 1, 0, 0, 1, 0, 1, 0, 0])]);
  const sof0 = Buffer.from([0xff, 0xc0, 0x00, 0x11, 8, height >> 8, height & 0xff, width >> 8, width & 0xff, 3, 1, 0x22, 0, 2, 0x11, 1, 3, 0x11, 1]);
  return Buffer.concat([Buffer.from([0xff, 0xd8]), app0, sof0, Buffer.from([0xff, 0xd9])]);
}

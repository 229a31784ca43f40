/**
 * The size of an uploaded image read from its header only (image-size: no pixel is decoded), so
 * an image too large to decode safely is refused before anything decodes it: thumbnails, the
 * completion report's PDF, a browser showing a logo or a floor plan.
 */
import { imageSize } from 'image-size';
import { LIMITS } from '@domain/limits';
import { errors } from '../errors';

export interface ImageDimensions {
  width: number;
  height: number;
}

const MEGAPIXELS = LIMITS.imageMaxPixels / 1_000_000;

/** “16000 × 16000 pixels”, the way the refusal names a size. */
function sizeText({ width, height }: ImageDimensions): string {
  return `${width.toLocaleString('en-US')} × ${height.toLocaleString('en-US')} pixels`;
}

/**
 * The image's width and height from its header, or a refusal naming the field:
 * 415 when the header cannot be read (the file starts like `label` but is not a readable one),
 * 400 `validation_failed` when width × height is over LIMITS.imageMaxPixels.
 */
export function checkImageHeader(data: Buffer, label: string, field = 'file'): ImageDimensions {
  let width: number | undefined;
  let height: number | undefined;
  try {
    ({ width, height } = imageSize(data));
  } catch {
    // fall through: no readable size
  }
  if (!width || !height || !Number.isFinite(width) || !Number.isFinite(height)) {
    throw errors.unsupportedType(
      `This file starts like a ${label} image but its header cannot be read, so it was not stored. Export the image again and retry.`,
      { [field]: `The ${label} header cannot be read.` },
    );
  }
  const dims = { width, height };
  if (width * height > LIMITS.imageMaxPixels) {
    const message = `The image is ${sizeText(dims)}; the largest accepted is ${MEGAPIXELS} megapixels (for example 8,000 × 5,000). Scale it down and retry.`;
    throw errors.validation(`${field}: ${message}`, { [field]: message });
  }
  return dims;
}

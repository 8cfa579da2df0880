import sharp, { type Metadata } from 'sharp';
import { photoLimits } from '@barmkeep/schemas';
import { AppError, badRequest } from './errors';

/** Formats we accept, judged from the bytes (sharp's own detection), never from a name or a header. */
const ACCEPTED = new Set(['jpeg', 'png', 'webp', 'gif', 'heif', 'avif', 'tiff']);

export const notAnImage = () =>
  badRequest('This file is not a photo we can read. Use a JPEG, PNG, WebP, AVIF or GIF image.', 'not_an_image', {
    file: ['This file is not a photo we can read'],
  });
const tooManyPixels = () =>
  new AppError(
    413,
    'image_too_large',
    `This image has more than ${photoLimits.maxInputPixels / 1e6} million pixels; resize it first`,
    {
      file: ['The image has too many pixels'],
    },
  );

export interface ProcessedPhoto {
  web: { data: Buffer; width: number; height: number };
  thumb: { data: Buffer; width: number; height: number };
  contentType: 'image/webp';
}

/**
 * Re-encode an upload to a web size and a thumbnail. The output carries no metadata at all (sharp
 * drops EXIF, XMP, IPTC and ICC unless asked to keep them), so GPS positions never leave the
 * phone; orientation is applied to the pixels first. Decompression bombs stop at limitInputPixels.
 */
export async function processPhoto(input: Buffer): Promise<ProcessedPhoto> {
  let meta: Metadata;
  try {
    meta = await sharp(input, { limitInputPixels: photoLimits.maxInputPixels }).metadata();
  } catch (err) {
    if (err instanceof Error && /pixel limit/i.test(err.message)) throw tooManyPixels();
    throw notAnImage();
  }
  if (!meta.format || !ACCEPTED.has(meta.format)) throw notAnImage();
  if ((meta.width ?? 0) * (meta.height ?? 0) > photoLimits.maxInputPixels) throw tooManyPixels();
  const pipeline = (size: number) =>
    sharp(input, { limitInputPixels: photoLimits.maxInputPixels, animated: false })
      .rotate()
      .resize({ width: size, height: size, fit: 'inside', withoutEnlargement: true })
      .webp({ quality: size > 400 ? 80 : 70 })
      .toBuffer({ resolveWithObject: true });
  try {
    const [web, thumb] = await Promise.all([pipeline(photoLimits.webMaxPx), pipeline(photoLimits.thumbMaxPx)]);
    return {
      web: { data: web.data, width: web.info.width, height: web.info.height },
      thumb: { data: thumb.data, width: thumb.info.width, height: thumb.info.height },
      contentType: 'image/webp',
    };
  } catch (err) {
    if (err instanceof Error && /pixel limit/i.test(err.message)) throw tooManyPixels();
    throw notAnImage();
  }
}

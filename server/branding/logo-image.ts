/**
 * Checks an uploaded logo by its content, never its name: a PNG or a JPEG whose structure is
 * whole (every PNG chunk's CRC and the complete image stream; a JPEG's markers to its end) and
 * that really decodes; then scales it to fit a print header.
 */
import { crc32, inflateSync } from 'node:zlib';
import { createCanvas, loadImage } from '@napi-rs/canvas';
import { HttpError } from '../http-error';

export type LogoMime = 'image/png' | 'image/jpeg';

export interface LogoImage {
  readonly bytes: Buffer;
  readonly mime: LogoMime;
  readonly width: number;
  readonly height: number;
}

/** Largest upload accepted. */
export const LOGO_LIMIT_BYTES = 1024 * 1024;
/** A stored logo fits this box: ~4× its printed size (120 × 56 pt), sharp at 300 dpi. */
export const LOGO_MAX_WIDTH = 600;
export const LOGO_MAX_HEIGHT = 280;
/** Larger images are refused before decoding: 1 MB of PNG may declare gigabytes of pixels. */
const MAX_SOURCE_SIDE = 6000;

const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

function refuse(message: string): HttpError {
  return new HttpError(400, 'invalid_logo', message, [{ path: 'body.logo', message }]);
}

/** The image's kind by its first bytes, or null for anything else. */
export function sniffLogo(bytes: Buffer): LogoMime | null {
  if (bytes.length >= 8 && bytes.subarray(0, 8).equals(PNG_SIGNATURE)) return 'image/png';
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff)
    return 'image/jpeg';
  return null;
}

/** Size a PNG declares, after checking every chunk (PNG specification, 3rd ed., 2023, §5). */
function checkPng(bytes: Buffer): { width: number; height: number } {
  let offset = 8;
  let width = 0;
  let height = 0;
  let ended = false;
  const data: Buffer[] = [];
  while (offset < bytes.length) {
    if (offset + 12 > bytes.length) throw refuse('The PNG file is cut short.');
    const length = bytes.readUInt32BE(offset);
    const type = bytes.toString('latin1', offset + 4, offset + 8);
    const end = offset + 12 + length;
    if (end > bytes.length) throw refuse('The PNG file is cut short.');
    const crc = bytes.readUInt32BE(end - 4);
    if (crc32(bytes.subarray(offset + 4, end - 4)) !== crc)
      throw refuse('The PNG file is damaged (a chunk checksum does not match).');
    if (offset === 8) {
      if (type !== 'IHDR' || length !== 13) throw refuse('The PNG file has no image header.');
      width = bytes.readUInt32BE(offset + 8);
      height = bytes.readUInt32BE(offset + 12);
    }
    if (type === 'IDAT') data.push(bytes.subarray(offset + 8, end - 4));
    offset = end;
    if (type === 'IEND') {
      ended = true;
      break;
    }
  }
  if (!ended) throw refuse('The PNG file is cut short (it has no end marker).');
  if (data.length === 0) throw refuse('The PNG file holds no image data.');
  checkSize(width, height);
  try {
    inflateSync(Buffer.concat(data), { maxOutputLength: 4 * (width + 1) * height * 2 + 1024 });
  } catch {
    throw refuse('The PNG file is damaged (its image data does not unpack).');
  }
  return { width, height };
}

/** Size a JPEG declares in its frame header, after checking it runs to its end marker. */
function checkJpeg(bytes: Buffer): { width: number; height: number } {
  // JPEG (ITU-T T.81, 1992, B.2): EOI ends the file; a few padding bytes may follow it.
  const tail = bytes.subarray(Math.max(0, bytes.length - 32));
  if (tail.lastIndexOf(Buffer.from([0xff, 0xd9])) < 0)
    throw refuse('The JPEG file is cut short (it has no end marker).');
  let offset = 2;
  while (offset + 9 < bytes.length) {
    if (bytes[offset] !== 0xff) throw refuse('The JPEG file is damaged.');
    const marker = bytes[offset + 1]!;
    if (marker === 0xff) {
      offset++;
      continue;
    }
    const length = bytes.readUInt16BE(offset + 2);
    // SOF0..SOF15 except DHT (C4), JPG (C8) and DAC (CC) carry the frame size.
    if (marker >= 0xc0 && marker <= 0xcf && ![0xc4, 0xc8, 0xcc].includes(marker)) {
      const height = bytes.readUInt16BE(offset + 5);
      const width = bytes.readUInt16BE(offset + 7);
      checkSize(width, height);
      return { width, height };
    }
    offset += 2 + length;
  }
  throw refuse('The JPEG file has no frame header.');
}

function checkSize(width: number, height: number): void {
  if (width < 1 || height < 1) throw refuse('The image has no pixels.');
  if (width > MAX_SOURCE_SIDE || height > MAX_SOURCE_SIDE)
    throw refuse(`A logo may be at most ${MAX_SOURCE_SIDE} pixels on a side.`);
}

/**
 * The uploaded bytes as a stored logo: checked, decoded, and scaled down (never up) to fit
 * {@link LOGO_MAX_WIDTH} × {@link LOGO_MAX_HEIGHT}, re-encoded in its own format (which also
 * drops any metadata it carried). Anything else is a 400 `invalid_logo`.
 */
export async function prepareLogo(bytes: Buffer): Promise<LogoImage> {
  if (bytes.length > LOGO_LIMIT_BYTES) throw refuse('A logo may be at most 1 MB.');
  const mime = sniffLogo(bytes);
  if (!mime) throw refuse('The logo must be a PNG or JPEG image; this file is neither.');
  const declared = mime === 'image/png' ? checkPng(bytes) : checkJpeg(bytes);
  let image;
  try {
    image = await loadImage(bytes);
  } catch {
    throw refuse('The image could not be decoded.');
  }
  if (image.width !== declared.width || image.height !== declared.height)
    throw refuse('The image could not be decoded.');
  const scale = Math.min(1, LOGO_MAX_WIDTH / image.width, LOGO_MAX_HEIGHT / image.height);
  const width = Math.max(1, Math.round(image.width * scale));
  const height = Math.max(1, Math.round(image.height * scale));
  const canvas = createCanvas(width, height);
  const context = canvas.getContext('2d');
  if (mime === 'image/jpeg') {
    // JPEG has no transparency: keep a white ground under it, as on paper.
    context.fillStyle = '#ffffff';
    context.fillRect(0, 0, width, height);
  }
  context.drawImage(image, 0, 0, width, height);
  const out =
    mime === 'image/png' ? canvas.toBuffer('image/png') : canvas.toBuffer('image/jpeg', 90);
  return { bytes: out, mime, width, height };
}

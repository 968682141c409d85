import sharp from 'sharp';
import {
  SIGNATURE_DATA_URL_PREFIX,
  SIGNATURE_MAX_BYTES,
  SIGNATURE_MAX_SIDE_PX,
  SIGNATURE_MIN_INK_PIXELS,
} from '@loambook/common';
import { DomainError } from '../common/domain-error';

/** The eight bytes every PNG file starts with (PNG specification, section 5.2). */
const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
const BASE64 = /^[A-Za-z0-9+/]+={0,2}$/;
/** Counting ink on a copy at most this wide and high keeps the check cheap for a large canvas. */
const CHECK_SIDE_PX = 1200;

const refused = (message: string) =>
  new DomainError('invalid', 'SIGNING.SIGNATURE_INVALID', message, [{ field: 'signaturePng', message }]);

/**
 * The PNG bytes of a drawn signature, or 400 SIGNING.SIGNATURE_INVALID saying what is wrong: not a PNG
 * data URL, not a PNG by its first bytes, larger than 500 KB, not decodable, too large a canvas, or blank
 * (fewer than SIGNATURE_MIN_INK_PIXELS pixels that are neither transparent nor paper-white).
 */
export async function readSignaturePng(dataUrl: string): Promise<Buffer> {
  if (typeof dataUrl !== 'string' || !dataUrl.startsWith(SIGNATURE_DATA_URL_PREFIX)) {
    throw refused('Send the signature as a PNG data URL (data:image/png;base64,…).');
  }
  const encoded = dataUrl.slice(SIGNATURE_DATA_URL_PREFIX.length);
  if (!BASE64.test(encoded)) throw refused('The signature is not valid base64.');
  const bytes = Buffer.from(encoded, 'base64');
  if (bytes.length > SIGNATURE_MAX_BYTES) {
    throw refused(`The signature image is too large: at most ${SIGNATURE_MAX_BYTES / 1024} KB.`);
  }
  if (bytes.length < PNG_SIGNATURE.length || !bytes.subarray(0, PNG_SIGNATURE.length).equals(PNG_SIGNATURE)) {
    throw refused('The signature is not a PNG image.');
  }

  let ink = 0;
  try {
    const image = sharp(bytes, { limitInputPixels: SIGNATURE_MAX_SIDE_PX * SIGNATURE_MAX_SIDE_PX });
    const meta = await image.metadata();
    if (meta.format !== 'png') throw refused('The signature is not a PNG image.');
    if ((meta.width ?? 0) > SIGNATURE_MAX_SIDE_PX || (meta.height ?? 0) > SIGNATURE_MAX_SIDE_PX) {
      throw refused(`The signature canvas is too large: at most ${SIGNATURE_MAX_SIDE_PX} pixels a side.`);
    }
    const { data, info } = await image
      .resize({ width: CHECK_SIDE_PX, height: CHECK_SIDE_PX, fit: 'inside', withoutEnlargement: true })
      .ensureAlpha()
      .raw()
      .toBuffer({ resolveWithObject: true });
    const step = info.channels;
    for (let i = 0; i + 3 < data.length; i += step) {
      const alpha = data[i + 3]!;
      // Rec. 601 luma, scaled by 1000: below 224 of 255 is darker than paper.
      const luma = 299 * data[i]! + 587 * data[i + 1]! + 114 * data[i + 2]!;
      if (alpha >= 32 && luma < 224_000) ink++;
    }
  } catch (e) {
    if (e instanceof DomainError) throw e;
    throw refused('The signature image could not be read.');
  }
  if (ink < SIGNATURE_MIN_INK_PIXELS) throw refused('The signature is blank: sign in the box.');
  return bytes;
}

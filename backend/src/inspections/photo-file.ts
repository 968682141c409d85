import { fromBuffer } from 'file-type';
import sharp from 'sharp';
import { PHOTO_THUMBNAIL_MAX_PX, type PhotoContentType } from '@loambook/common';
import { invalid } from '../common/domain-error';
import { UploadRefusedError } from './upload-errors';

/** What multer hands over with its default (memory) storage. */
export interface UploadedPhotoFile {
  buffer: Buffer;
  size: number;
  originalname: string;
}

/**
 * How a photo upload is accepted, for inspections and the crew's log alike: the type is read from the
 * bytes (file-type), never from the name or the declared type; JPEG, PNG, WebP or HEIC (phones write the
 * 'heic' brand, some tools HEIF's generic 'mif1': both kept as HEIC); at most PHOTO_MAX_BYTES (multer's
 * limit on the route); a JPEG thumbnail with sharp at most PHOTO_THUMBNAIL_MAX_PX on its longer side,
 * upright by its EXIF orientation and without the rest of the metadata (GPS included). The sharp build
 * here has no HEVC decoder, so HEIC photos are kept without a thumbnail; any other type that will not
 * decode is not a photo. Refusals are UploadRefusedError, answered by UploadErrorsFilter.
 */
const ACCEPTED: Record<string, { contentType: PhotoContentType; ext: string }> = {
  'image/jpeg': { contentType: 'image/jpeg', ext: 'jpg' },
  'image/png': { contentType: 'image/png', ext: 'png' },
  'image/webp': { contentType: 'image/webp', ext: 'webp' },
  'image/heic': { contentType: 'image/heic', ext: 'heic' },
  'image/heif': { contentType: 'image/heic', ext: 'heic' },
};

export interface CheckedPhoto {
  /** The upload's bytes and size, once checked. */
  buffer: Buffer;
  size: number;
  contentType: PhotoContentType;
  ext: string;
  /** null for HEIC, which this server's sharp cannot decode. */
  thumbnail: Buffer | null;
}

export async function checkPhotoFile(file: UploadedPhotoFile | undefined): Promise<CheckedPhoto> {
  if (!file) throw invalid('file', 'Choose a photo to upload (the form part named "file").');
  if (file.size === 0) throw invalid('file', 'The file is empty.');
  const detected = await fromBuffer(file.buffer);
  const kind = detected ? ACCEPTED[detected.mime] : undefined;
  if (!kind) {
    throw new UploadRefusedError(
      415,
      'UPLOAD.UNSUPPORTED_TYPE',
      `This file is not a JPEG, PNG, WebP or HEIC photo${detected ? ` (its content is ${detected.mime})` : ''}, ` +
        'whatever its name says. Send the photo itself.',
    );
  }
  try {
    const thumbnail = await sharp(file.buffer)
      .rotate()
      .resize(PHOTO_THUMBNAIL_MAX_PX, PHOTO_THUMBNAIL_MAX_PX, { fit: 'inside', withoutEnlargement: true })
      .flatten({ background: '#ffffff' })
      .jpeg({ quality: 80 })
      .toBuffer();
    return { ...kind, buffer: file.buffer, size: file.size, thumbnail };
  } catch {
    if (kind.contentType === 'image/heic')
      return { ...kind, buffer: file.buffer, size: file.size, thumbnail: null };
    throw new UploadRefusedError(
      415,
      'UPLOAD.UNSUPPORTED_TYPE',
      `This file starts like a ${kind.contentType.slice(6).toUpperCase()} image but cannot be read as one.`,
    );
  }
}

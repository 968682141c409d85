import { Readable } from 'node:stream';
import { Inject, Injectable, type OnModuleDestroy } from '@nestjs/common';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { APP_CONFIG, type AppConfig } from '../config/config';

/** The object asked for is not in the bucket. */
export class StoredObjectMissingError extends Error {
  constructor(readonly key: string) {
    super(`No stored object at ${key}`);
    this.name = 'StoredObjectMissingError';
  }
}

export interface StoredObject {
  stream: Readable;
  contentType: string | undefined;
  contentLength: number | undefined;
}

/**
 * Files (photos, thumbnails, contract PDFs) in one S3 bucket, so that every app server sees the same
 * files. Keys are chosen by the caller and name the branch first: `branches/<branchId>/…`.
 * Locally the bucket is s3rver's (scripts/lib/fakes.mjs); in production any S3-compatible service.
 */
@Injectable()
export class StorageService implements OnModuleDestroy {
  private readonly client: S3Client;
  private readonly bucket: string;

  constructor(@Inject(APP_CONFIG) config: AppConfig) {
    const s3 = config.s3;
    this.bucket = s3.bucket;
    this.client = new S3Client({
      endpoint: s3.endpoint,
      region: s3.region,
      credentials: { accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey },
      forcePathStyle: s3.forcePathStyle,
      // Checksums only where the API requires them: s3rver (and some S3-compatible services) do not
      // know the newer flexible-checksum headers.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    });
  }

  async put(key: string, body: Buffer, contentType: string): Promise<void> {
    await this.client.send(
      new PutObjectCommand({
        Bucket: this.bucket,
        Key: key,
        Body: body,
        ContentType: contentType,
        ContentLength: body.length,
      }),
    );
  }

  /** A stream of the object; throws StoredObjectMissingError when there is none. */
  async get(key: string): Promise<StoredObject> {
    try {
      const res = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
      if (!(res.Body instanceof Readable)) throw new Error(`Unexpected body for ${key}`);
      return { stream: res.Body, contentType: res.ContentType, contentLength: res.ContentLength };
    } catch (e) {
      if (isMissing(e)) throw new StoredObjectMissingError(key);
      throw e;
    }
  }

  async getBuffer(key: string): Promise<Buffer> {
    const { stream } = await this.get(key);
    const chunks: Buffer[] = [];
    for await (const chunk of stream) chunks.push(Buffer.from(chunk as Uint8Array));
    return Buffer.concat(chunks);
  }

  /** Deletes the object; deleting one that is not there is not an error (S3's own rule). */
  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  onModuleDestroy(): void {
    this.client.destroy();
  }
}

function isMissing(e: unknown): boolean {
  const err = e as { name?: string; $metadata?: { httpStatusCode?: number } };
  return err?.name === 'NoSuchKey' || err?.name === 'NotFound' || err?.$metadata?.httpStatusCode === 404;
}

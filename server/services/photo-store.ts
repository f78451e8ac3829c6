/**
 * Photo bytes in object storage: the only module that talks to S3. Objects are keyed by the photo's
 * id alone (`photos/<id>/original`, `photos/<id>/thumb.webp`), so a row never holds a path or a URL
 * and the store can move without touching the database.
 */
import { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadObjectCommand,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import type { Config } from '../config';

/** The upload as kept (location stripped unless the organisation keeps it), and its thumbnail. */
export type PhotoVariant = 'original' | 'thumb';

export type PhotoStoreConfig = Pick<
  Config,
  'S3_ENDPOINT' | 'S3_REGION' | 'S3_BUCKET' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY' | 'S3_FORCE_PATH_STYLE'
>;

/** What a stored object says about itself. */
export interface StoredObject {
  contentType: string;
  bytes: number;
}

/** The object key of a photo's variant. */
export function photoKey(photoId: string, variant: PhotoVariant): string {
  return variant === 'original' ? `photos/${photoId}/original` : `photos/${photoId}/thumb.webp`;
}

/** Put, read (as a stream), look at and delete a photo's objects. */
export class PhotoStore {
  private readonly client: S3Client;
  private readonly bucket: string;

  constructor(config: PhotoStoreConfig) {
    this.bucket = config.S3_BUCKET;
    this.client = new S3Client({
      region: config.S3_REGION,
      endpoint: config.S3_ENDPOINT,
      forcePathStyle: config.S3_FORCE_PATH_STYLE === '1',
      credentials:
        config.S3_ACCESS_KEY_ID && config.S3_SECRET_ACCESS_KEY
          ? { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY }
          : undefined,
      // checksums only where S3 requires them: the SDK's default trailing checksums are not
      // understood by every S3-compatible store (s3rver among them)
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    });
  }

  /** Store one variant; `metadata` becomes `x-amz-meta-*` on the object. */
  async put(
    photoId: string,
    variant: PhotoVariant,
    body: Buffer,
    contentType: string,
    metadata: Record<string, string> = {},
  ): Promise<void> {
    await this.client.send(
      new PutObjectCommand({
        Bucket: this.bucket,
        Key: photoKey(photoId, variant),
        Body: body,
        ContentType: contentType,
        ContentLength: body.length,
        Metadata: metadata,
      }),
    );
  }

  /** The variant's bytes as a stream, or null when it is not stored. */
  async get(photoId: string, variant: PhotoVariant): Promise<(StoredObject & { body: Readable }) | null> {
    try {
      const out = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: photoKey(photoId, variant) }));
      if (!(out.Body instanceof Readable)) throw new Error('object storage answered without a stream');
      return {
        body: out.Body,
        contentType: out.ContentType ?? 'application/octet-stream',
        bytes: out.ContentLength ?? 0,
      };
    } catch (error) {
      if (isMissing(error)) return null;
      throw error;
    }
  }

  /** The variant's type and size without its bytes, or null when it is not stored. */
  async head(photoId: string, variant: PhotoVariant): Promise<StoredObject | null> {
    try {
      const out = await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: photoKey(photoId, variant) }));
      return { contentType: out.ContentType ?? 'application/octet-stream', bytes: out.ContentLength ?? 0 };
    } catch (error) {
      if (isMissing(error)) return null;
      throw error;
    }
  }

  /** Remove the variant; removing one that is not there is not an error (S3 answers 204 either way). */
  async delete(photoId: string, variant: PhotoVariant): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: photoKey(photoId, variant) }));
  }

  /** Close the client's sockets. */
  close(): void {
    this.client.destroy();
  }
}

/** A missing key is 404 (HeadObject has no body, so its error carries only the status). */
function isMissing(error: unknown): boolean {
  const status = (error as { $metadata?: { httpStatusCode?: number } } | null)?.$metadata?.httpStatusCode;
  const name = (error as { name?: string } | null)?.name;
  return status === 404 || name === 'NoSuchKey' || name === 'NotFound';
}

import "server-only";
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";
import type { ObjectStoreConfig } from "./config";

/** What the app needs of an object store: write once, read, delete. */
export interface ObjectStore {
  /** Bucket and endpoint, for messages. */
  readonly where: string;
  put(key: string, bytes: Uint8Array, contentType: string): Promise<void>;
  /** The object's bytes, or null when there is no such object. */
  get(key: string): Promise<Uint8Array | null>;
  delete(key: string): Promise<void>;
  /** Find the bucket, or create it when missing. */
  ensureBucket?(): Promise<void>;
}

/** An S3-compatible object store through the AWS SDK (path-style addressing, so any S3-compatible server works). */
export function s3ObjectStore(config: ObjectStoreConfig): ObjectStore & { ensureBucket(): Promise<void> } {
  const client = new S3Client({
    endpoint: config.url,
    region: config.region,
    forcePathStyle: true,
    credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
    // Without these the SDK sends aws-chunked bodies with trailing checksums, which some S3-compatible servers
    // store framing and all: the object's bytes (and SHA-256) would silently differ from the upload.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  const Bucket = config.bucket;
  return {
    where: `bucket "${Bucket}" at ${config.url}`,
    async put(key, bytes, contentType) {
      await client.send(
        new PutObjectCommand({ Bucket, Key: key, Body: bytes, ContentType: contentType, ContentLength: bytes.length }),
      );
    },
    async get(key) {
      try {
        const res = await client.send(new GetObjectCommand({ Bucket, Key: key }));
        if (!res.Body) return null;
        return await res.Body.transformToByteArray();
      } catch (err) {
        const name = (err as { name?: string }).name;
        if (name === "NoSuchKey" || name === "NotFound") return null;
        throw err;
      }
    },
    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: key }));
    },
    async ensureBucket() {
      try {
        await client.send(new HeadBucketCommand({ Bucket }));
      } catch (err) {
        const e = err as { name?: string; $metadata?: { httpStatusCode?: number } };
        if (e.name !== "NotFound" && e.$metadata?.httpStatusCode !== 404) throw err;
        await client.send(new CreateBucketCommand({ Bucket }));
      }
    },
  };
}

// Object storage through the S3 API (a local S3-compatible fake in the demo and the tests).
// Files never touch the web server's disk: they go from memory to the bucket and back.
import "server-only";
import {
  DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, ListObjectsV2Command, NoSuchKey, NotFound, PutObjectCommand, S3Client,
} from "@aws-sdk/client-s3";
import { env } from "@/lib/env";

declare global {
  var __cuspalS3: S3Client | undefined;
}

export function s3(): S3Client {
  if (globalThis.__cuspalS3) return globalThis.__cuspalS3;
  const e = env();
  globalThis.__cuspalS3 = new S3Client({
    endpoint: e.S3_ENDPOINT,
    region: e.S3_REGION,
    credentials: { accessKeyId: e.S3_ACCESS_KEY_ID, secretAccessKey: e.S3_SECRET_ACCESS_KEY },
    // The fake (and many S3-compatible stores) serve buckets as paths, not sub-domains.
    forcePathStyle: true,
    // Checksums on every request are a newer default that S3-compatible fakes may not know.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  return globalThis.__cuspalS3;
}

const bucket = () => env().S3_BUCKET;

export async function putObject(key: string, body: Uint8Array, contentType: string): Promise<void> {
  await s3().send(new PutObjectCommand({ Bucket: bucket(), Key: key, Body: body, ContentType: contentType, ContentLength: body.byteLength }));
}

export async function deleteObject(key: string): Promise<void> {
  await s3().send(new DeleteObjectCommand({ Bucket: bucket(), Key: key }));
}

/** The object's bytes as a web stream, or null when it is not in the bucket. */
export async function getObjectStream(key: string): Promise<{ body: ReadableStream<Uint8Array>; length?: number } | null> {
  try {
    const res = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    if (!res.Body) return null;
    return { body: res.Body.transformToWebStream(), length: res.ContentLength };
  } catch (err) {
    if (err instanceof NoSuchKey) return null;
    throw err;
  }
}

export async function getObjectBytes(key: string): Promise<Uint8Array | null> {
  try {
    const res = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
    return res.Body ? await res.Body.transformToByteArray() : null;
  } catch (err) {
    if (err instanceof NoSuchKey) return null;
    throw err;
  }
}

export async function objectExists(key: string): Promise<boolean> {
  try {
    await s3().send(new HeadObjectCommand({ Bucket: bucket(), Key: key }));
    return true;
  } catch (err) {
    if (err instanceof NotFound || (err as { name?: string }).name === "NotFound") return false;
    throw err;
  }
}

export async function listObjectKeys(prefix: string): Promise<string[]> {
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const res = await s3().send(new ListObjectsV2Command({ Bucket: bucket(), Prefix: prefix, ContinuationToken: token }));
    keys.push(...(res.Contents ?? []).flatMap((o) => (o.Key ? [o.Key] : [])));
    token = res.IsTruncated ? res.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

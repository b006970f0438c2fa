import "server-only";
import { CreateBucketCommand, GetObjectCommand, HeadBucketCommand, PutObjectCommand, S3Client } from "@aws-sdk/client-s3";
import { officeConfig } from "./office-config";

// Photos and documents in S3-compatible object storage (s3rver locally).
let cached: { key: string; client: S3Client } | undefined;
/**
 * Longest wait for one call to object storage. Some are made inside a transaction that holds the
 * shop's sync lock (the report copy stored at "ready" and at handover): a store that stalls must
 * fail that move, not hold every tablet's sync behind it.
 */
const STORE_CALL_MS = 60_000;
const bounded = () => ({ abortSignal: AbortSignal.timeout(STORE_CALL_MS) });
const bucketsReady = new Set<string>();

function client(): { s3: S3Client; bucket: string } {
  const cfg = officeConfig();
  const key = `${cfg.S3_ENDPOINT}|${cfg.S3_ACCESS_KEY_ID}`;
  if (cached?.key !== key) {
    cached = {
      key,
      client: new S3Client({
        endpoint: cfg.S3_ENDPOINT,
        region: cfg.S3_REGION,
        forcePathStyle: true,
        credentials: { accessKeyId: cfg.S3_ACCESS_KEY_ID, secretAccessKey: cfg.S3_SECRET_ACCESS_KEY },
      }),
    };
  }
  return { s3: cached.client, bucket: cfg.S3_BUCKET };
}

async function ensureBucket(s3: S3Client, bucket: string) {
  if (bucketsReady.has(bucket)) return;
  try {
    await s3.send(new HeadBucketCommand({ Bucket: bucket }), bounded());
  } catch {
    await s3.send(new CreateBucketCommand({ Bucket: bucket }), bounded());
  }
  bucketsReady.add(bucket);
}

export async function putObject(objectKey: string, body: Buffer, contentType: string): Promise<void> {
  const { s3, bucket } = client();
  await ensureBucket(s3, bucket);
  await s3.send(new PutObjectCommand({ Bucket: bucket, Key: objectKey, Body: body, ContentType: contentType }), bounded());
}

export async function getObject(objectKey: string): Promise<{ body: Uint8Array; contentType: string }> {
  const { s3, bucket } = client();
  const r = await s3.send(new GetObjectCommand({ Bucket: bucket, Key: objectKey }), bounded());
  return { body: await r.Body!.transformToByteArray(), contentType: r.ContentType ?? "application/octet-stream" };
}

import "server-only";
import {
  DeleteObjectCommand,
  GetObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from "@aws-sdk/client-s3";

// The object store for photographs and documents. The same code talks to the local fake
// (scripts/lib/fake-s3.sh) and to a hosted store: only the endpoint and keys differ.

export interface StorageConfig {
  endpoint?: string;
  bucket: string;
  region: string;
  accessKeyId?: string;
  secretAccessKey?: string;
}

export function storageConfigFromEnv(env: NodeJS.ProcessEnv = process.env): StorageConfig {
  const bucket = env.S3_BUCKET;
  if (!bucket) throw new Error("S3_BUCKET is not set (scripts/start.sh and scripts/test.sh set it)");
  return {
    endpoint: env.S3_ENDPOINT || undefined,
    bucket,
    region: env.S3_REGION || "us-east-1",
    accessKeyId: env.S3_ACCESS_KEY_ID || undefined,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY || undefined,
  };
}

const g = globalThis as unknown as { __dentateS3?: { client: S3Client; bucket: string } };

function store(): { client: S3Client; bucket: string } {
  if (g.__dentateS3) return g.__dentateS3;
  const cfg = storageConfigFromEnv();
  const client = new S3Client({
    endpoint: cfg.endpoint,
    region: cfg.region,
    credentials: cfg.accessKeyId && cfg.secretAccessKey ? { accessKeyId: cfg.accessKeyId, secretAccessKey: cfg.secretAccessKey } : undefined,
    // Path-style addressing works with loopback fakes and with hosted stores alike.
    forcePathStyle: true,
    // With the default (always) checksums the fake stores the chunk framing instead of the bytes.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  g.__dentateS3 = { client, bucket: cfg.bucket };
  return g.__dentateS3;
}

export async function putObject(key: string, body: Uint8Array, contentType: string, sha256Hex?: string): Promise<void> {
  const { client, bucket } = store();
  await client.send(
    new PutObjectCommand({
      Bucket: bucket,
      Key: key,
      Body: body,
      ContentType: contentType,
      ContentLength: body.byteLength,
      Metadata: sha256Hex ? { sha256: sha256Hex } : undefined,
    }),
  );
}

export interface StoredObject {
  body: ReadableStream<Uint8Array>;
  contentLength?: number;
}

/** The object as a web stream, or null when the store has no such key. */
export async function getObject(key: string): Promise<StoredObject | null> {
  const { client, bucket } = store();
  try {
    const out = await client.send(new GetObjectCommand({ Bucket: bucket, Key: key }));
    if (!out.Body) return null;
    return { body: out.Body.transformToWebStream() as ReadableStream<Uint8Array>, contentLength: out.ContentLength };
  } catch (err) {
    const name = (err as { name?: string }).name;
    if (name === "NoSuchKey" || name === "NotFound") return null;
    throw err;
  }
}

/** Best effort: a key that is already gone is not an error. */
export async function deleteObjects(keys: readonly string[]): Promise<void> {
  const list = keys.filter(Boolean);
  if (list.length === 0) return;
  const { client, bucket } = store();
  // One DeleteObject per key: the batch call needs a Content-MD5 that not every fake accepts.
  await Promise.all(list.map((Key) => client.send(new DeleteObjectCommand({ Bucket: bucket, Key }))));
}

/** Every key under a prefix (used by consistency checks and tests). */
export async function listObjectKeys(prefix = ""): Promise<string[]> {
  const { client, bucket } = store();
  const keys: string[] = [];
  let token: string | undefined;
  do {
    const out = await client.send(new ListObjectsV2Command({ Bucket: bucket, Prefix: prefix || undefined, ContinuationToken: token }));
    for (const o of out.Contents ?? []) if (o.Key) keys.push(o.Key);
    token = out.IsTruncated ? out.NextContinuationToken : undefined;
  } while (token);
  return keys;
}

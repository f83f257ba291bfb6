// The fake S3 that npm test starts on loopback (scripts/lib/fake-s3.ts): its settings for an in-test driver and
// for an app instance started with STORAGE_DRIVER=s3, and an object's bytes.
import type { Readable } from 'node:stream'
import type { StoredObject } from '../../server/utils/storage'

export function testS3Config() {
  const env = process.env
  const endpoint = env.TALLYMARK_TEST_S3_ENDPOINT
  if (!endpoint) throw new Error('TALLYMARK_TEST_S3_ENDPOINT is not set: run this through npm test, which starts the fake S3.')
  return {
    endpoint,
    region: 'us-east-1',
    bucket: env.TALLYMARK_TEST_S3_BUCKET ?? '',
    accessKeyId: env.TALLYMARK_TEST_S3_ACCESS_KEY_ID ?? '',
    secretAccessKey: env.TALLYMARK_TEST_S3_SECRET_ACCESS_KEY ?? '',
  }
}

/** The environment that makes an app instance keep its photos in the fake S3. */
export function testS3AppEnv(): Record<string, string> {
  const s3 = testS3Config()
  return {
    STORAGE_DRIVER: 's3',
    S3_ENDPOINT: s3.endpoint,
    S3_REGION: s3.region,
    S3_BUCKET: s3.bucket,
    S3_ACCESS_KEY_ID: s3.accessKeyId,
    S3_SECRET_ACCESS_KEY: s3.secretAccessKey,
  }
}

export async function storedBytes(object: StoredObject): Promise<Buffer> {
  if (Buffer.isBuffer(object.body)) return object.body
  const chunks: Buffer[] = []
  for await (const chunk of object.body as Readable) chunks.push(Buffer.from(chunk as Uint8Array))
  return Buffer.concat(chunks)
}

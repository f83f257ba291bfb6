// A fake S3 on loopback for the S3 storage driver's tests (s3rver, keeping objects under `dir`).
// Fixed credentials S3RVER/S3RVER; the bucket below exists from the start.
import { createRequire } from 'node:module'
import { mkdirSync } from 'node:fs'

export interface FakeS3 {
  endpoint: string
  bucket: string
  accessKeyId: string
  secretAccessKey: string
  stop: () => Promise<void>
}

interface S3rverInstance {
  run: () => Promise<{ address: string, port: number }>
  close: () => Promise<void>
}
type S3rverClass = new (options: Record<string, unknown>) => S3rverInstance

export const FAKE_S3_BUCKET = 'tallymark-test'

export async function startFakeS3(dir: string, port: number): Promise<FakeS3> {
  mkdirSync(dir, { recursive: true })
  // s3rver ships no type declarations: loaded through require and typed by the two methods used here.
  const S3rver = createRequire(import.meta.url)('s3rver') as S3rverClass
  const server = new S3rver({
    address: '127.0.0.1',
    port,
    directory: dir,
    silent: true,
    // Path-style access only (the driver sets forcePathStyle).
    vhostBuckets: false,
    configureBuckets: [{ name: FAKE_S3_BUCKET, configs: [] }],
  })
  const info = await server.run()
  return {
    endpoint: `http://127.0.0.1:${info.port}`,
    bucket: FAKE_S3_BUCKET,
    accessKeyId: 'S3RVER',
    secretAccessKey: 'S3RVER',
    stop: () => server.close(),
  }
}

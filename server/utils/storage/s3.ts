// S3-compatible bucket storage through AWS SDK v3. Path-style addressing, so any endpoint works
// (the local fake in tests, a self-hosted store) without bucket subdomains. The SDK is loaded on first
// use, so the local driver does not pay for it at start-up.
import type { Readable } from 'node:stream'
import type { S3Client } from '@aws-sdk/client-s3'
import type { AppConfig } from '../config'
import { assertStorageKey } from './keys'
import type { StorageDriver } from './index'

type Sdk = typeof import('@aws-sdk/client-s3')

export function createS3StorageDriver(config: AppConfig['s3']): StorageDriver {
  if (!config.bucket) throw new Error('STORAGE_DRIVER=s3 needs S3_BUCKET.')
  const Bucket = config.bucket
  let ready: Promise<{ sdk: Sdk, client: S3Client }> | undefined

  function connect() {
    ready ??= import('@aws-sdk/client-s3').then(sdk => ({
      sdk,
      client: new sdk.S3Client({
        region: config.region || 'us-east-1',
        endpoint: config.endpoint || undefined,
        forcePathStyle: true,
        // Without keys the SDK's default chain applies (environment, instance role).
        credentials: config.accessKeyId ? { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey } : undefined,
      }),
    }))
    return ready
  }

  return {
    name: 's3',
    async put(key, bytes, contentType) {
      const { sdk, client } = await connect()
      await client.send(new sdk.PutObjectCommand({ Bucket, Key: assertStorageKey(key), Body: bytes, ContentType: contentType, ContentLength: bytes.length }))
    },
    async get(key) {
      const { sdk, client } = await connect()
      try {
        const res = await client.send(new sdk.GetObjectCommand({ Bucket, Key: assertStorageKey(key) }))
        if (!res.Body) return null
        return { body: res.Body as Readable, contentType: res.ContentType ?? 'application/octet-stream', size: res.ContentLength }
      }
      catch (error) {
        // Only a missing key is "no object": a missing bucket (also a 404) is a configuration error to report.
        if (error instanceof sdk.NoSuchKey || (error instanceof sdk.S3ServiceException && error.name === 'NoSuchKey')) return null
        throw error
      }
    },
    async delete(key) {
      const { sdk, client } = await connect()
      await client.send(new sdk.DeleteObjectCommand({ Bucket, Key: assertStorageKey(key) }))
    },
  }
}

import { S3Client } from '@aws-sdk/client-s3';
import { getConfig } from '../config';

let client: S3Client | undefined;

/**
 * The one S3 client, built from config. Path-style addressing works with every S3-compatible service
 * (and the local fake, which cannot resolve bucket sub-domains). The two checksum options keep the SDK
 * from framing bodies as aws-chunked and from binding a CRC32 of an empty body into presigned PUT URLs,
 * which would make every browser upload fail.
 */
export function getS3(): S3Client {
  if (client) return client;
  const config = getConfig();
  client = new S3Client({
    endpoint: config.S3_ENDPOINT,
    region: config.S3_REGION,
    forcePathStyle: true,
    credentials: { accessKeyId: config.S3_ACCESS_KEY_ID, secretAccessKey: config.S3_SECRET_ACCESS_KEY },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  return client;
}

export function bucketName(): string {
  return getConfig().S3_BUCKET;
}

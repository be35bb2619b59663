import { randomBytes } from 'node:crypto';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  ListObjectsV2Command,
  PutObjectCommand,
  S3Client,
} from '@aws-sdk/client-s3';
import { getSignedUrl } from '@aws-sdk/s3-request-presigner';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { startS3Fake, type S3Fake } from '../../../fakes/s3/server';
import { makeTempDir } from './temp-dir';

const BUCKET = 'lightyard-test';
const APP_ORIGIN = 'http://localhost:4321';
const APP_ORIGIN_BY_IP = 'http://127.0.0.1:4321';

let temp: Awaited<ReturnType<typeof makeTempDir>>;
let fake: S3Fake;
let client: S3Client;
let endpoint: string;

beforeEach(async () => {
  temp = await makeTempDir();
  fake = await startS3Fake({
    port: 0,
    dir: temp.dir,
    bucket: BUCKET,
    allowedOrigins: [APP_ORIGIN, APP_ORIGIN_BY_IP],
  });
  endpoint = `http://127.0.0.1:${fake.port}`;
  client = new S3Client({
    endpoint,
    region: 'us-east-1',
    forcePathStyle: true,
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
});

afterEach(async () => {
  client.destroy();
  await fake.stop();
  await temp.remove();
});

function preflight(origin: string, method = 'PUT'): Promise<Response> {
  return fetch(`${endpoint}/${BUCKET}/uploads/photo.jpg`, {
    method: 'OPTIONS',
    headers: {
      Origin: origin,
      'Access-Control-Request-Method': method,
      'Access-Control-Request-Headers': 'content-type',
    },
  });
}

describe('s3 fake', () => {
  test('creates the bucket at start', async () => {
    await expect(client.send(new HeadBucketCommand({ Bucket: BUCKET }))).resolves.toBeDefined();
  });

  test('puts, gets, heads, lists and deletes an object', async () => {
    const body = Buffer.from('{"roc_mm":500}');
    const put = await client.send(
      new PutObjectCommand({ Bucket: BUCKET, Key: 'specs/mirror.json', Body: body, ContentType: 'application/json' }),
    );
    expect(put.ETag).toMatch(/^"[0-9a-f]{32}"$/);

    const got = await client.send(new GetObjectCommand({ Bucket: BUCKET, Key: 'specs/mirror.json' }));
    expect(Buffer.from(await got.Body!.transformToByteArray())).toEqual(body);

    const head = await client.send(new HeadObjectCommand({ Bucket: BUCKET, Key: 'specs/mirror.json' }));
    expect(head.ContentLength).toBe(body.length);
    expect(head.ContentType).toBe('application/json');
    expect(head.ETag).toBe(put.ETag);

    const listed = await client.send(new ListObjectsV2Command({ Bucket: BUCKET, Prefix: 'specs/' }));
    expect(listed.Contents?.map((object) => object.Key)).toEqual(['specs/mirror.json']);

    await client.send(new DeleteObjectCommand({ Bucket: BUCKET, Key: 'specs/mirror.json' }));
    await expect(client.send(new HeadObjectCommand({ Bucket: BUCKET, Key: 'specs/mirror.json' }))).rejects.toMatchObject({
      $metadata: { httpStatusCode: 404 },
    });
  });

  test('a presigned PUT from fetch stores exactly the bytes sent', async () => {
    const bytes = randomBytes(64 * 1024);
    const url = await getSignedUrl(client, new PutObjectCommand({ Bucket: BUCKET, Key: 'uploads/photo.jpg', ContentType: 'image/jpeg' }), {
      expiresIn: 300,
    });
    const upload = await fetch(url, { method: 'PUT', body: new Uint8Array(bytes), headers: { 'Content-Type': 'image/jpeg' } });
    expect(upload.status).toBe(200);

    const got = await client.send(new GetObjectCommand({ Bucket: BUCKET, Key: 'uploads/photo.jpg' }));
    expect(got.ContentType).toBe('image/jpeg');
    expect(Buffer.from(await got.Body!.transformToByteArray()).equals(bytes)).toBe(true);
  });

  test('allows a browser upload preflight from the app origin under either loopback name', async () => {
    for (const origin of [APP_ORIGIN, APP_ORIGIN_BY_IP]) {
      const response = await preflight(origin);
      expect(response.status).toBe(200);
      expect(response.headers.get('access-control-allow-origin')).toBeTruthy();
      expect(response.headers.get('access-control-allow-methods')).toContain('PUT');
      expect(response.headers.get('access-control-allow-headers')).toContain('content-type');
    }
  });

  test('refuses a preflight from another origin or for a method not allowed', async () => {
    for (const response of [await preflight('http://evil.example'), await preflight(APP_ORIGIN, 'DELETE')]) {
      expect(response.status).toBe(403);
      expect(response.headers.get('access-control-allow-origin')).toBeNull();
    }
  });

  test('a cross-origin GET from the app may read the ETag', async () => {
    await client.send(new PutObjectCommand({ Bucket: BUCKET, Key: 'a.txt', Body: 'a' }));
    const response = await fetch(`${endpoint}/${BUCKET}/a.txt`, { headers: { Origin: APP_ORIGIN } });
    expect(response.status).toBe(200);
    expect(response.headers.get('access-control-allow-origin')).toBe(APP_ORIGIN);
    expect(response.headers.get('access-control-expose-headers')).toContain('ETag');
    expect(await response.text()).toBe('a');
  });
});

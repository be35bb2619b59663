import { mkdir } from 'node:fs/promises';
import S3rver from 's3rver';

export interface S3FakeOptions {
  host?: string;
  port: number;
  dir: string;
  bucket: string;
  /** Browser origins that may PUT/GET/HEAD objects directly (presigned uploads and downloads). */
  allowedOrigins: string[];
}

export interface S3Fake {
  port: number;
  stop(): Promise<void>;
}

const BROWSER_METHODS = ['GET', 'PUT', 'HEAD'];
const PREFLIGHT_CACHE_SECONDS = 3000;

function escapeXml(value: string): string {
  return value.replace(/[<>&'"]/g, (char) => `&#${char.charCodeAt(0)};`);
}

/** The bucket's CORS document, in the XML that PutBucketCors takes on the real service. */
export function corsConfigurationXml(allowedOrigins: string[]): string {
  const origins = allowedOrigins.map((origin) => `<AllowedOrigin>${escapeXml(origin)}</AllowedOrigin>`);
  const methods = BROWSER_METHODS.map((method) => `<AllowedMethod>${method}</AllowedMethod>`);
  return [
    '<CORSConfiguration>',
    '<CORSRule>',
    ...origins,
    ...methods,
    // Presigned PUTs from the browser carry Content-Type and sometimes x-amz-* headers.
    '<AllowedHeader>*</AllowedHeader>',
    // The upload code reads the ETag to confirm what was stored.
    '<ExposeHeader>ETag</ExposeHeader>',
    `<MaxAgeSeconds>${PREFLIGHT_CACHE_SECONDS}</MaxAgeSeconds>`,
    '</CORSRule>',
    '</CORSConfiguration>',
  ].join('');
}

export async function startS3Fake({ host = '127.0.0.1', port, dir, bucket, allowedOrigins }: S3FakeOptions): Promise<S3Fake> {
  if (allowedOrigins.length === 0) {
    throw new Error('startS3Fake: allowedOrigins must name at least one origin');
  }
  await mkdir(dir, { recursive: true });

  const s3 = new S3rver({
    address: host,
    port,
    directory: dir,
    silent: true,
    // The app addresses buckets by path (forcePathStyle); with virtual hosts on, any host name
    // other than localhost or an IP would be taken for a bucket name.
    vhostBuckets: false,
    configureBuckets: [{ name: bucket, configs: [corsConfigurationXml(allowedOrigins)] }],
  });
  const address = await s3.run();

  return {
    port: address.port,
    async stop() {
      const closing = s3.close();
      // Keep-alive sockets from SDK clients would otherwise hold close() open until they time out.
      s3.httpServer?.closeAllConnections();
      await closing;
    },
  };
}

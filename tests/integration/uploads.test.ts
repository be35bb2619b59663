import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { crc32, deflateSync } from 'node:zlib';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { Client, startTestApp, type TestApp } from '../setup/app';

const PASSWORD = 'demo-password-1';
const MB = 1024 * 1024;
let app: TestApp;
let s3: S3Client;
let seller: Client;
let sellerLabId: string;

beforeAll(async () => {
  app = await startTestApp();
  s3 = new S3Client({
    endpoint: app.env.S3_ENDPOINT,
    region: 'us-east-1',
    forcePathStyle: true,
    credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  seller = await as('seller');
  sellerLabId = (await (await seller.get('/api/me')).json()).user.labs[0].id;
});
afterAll(async () => {
  s3?.destroy();
  await app?.stop();
});

async function as(who: string): Promise<Client> {
  const c = new Client(app.origin);
  expect((await c.signIn(`${who}@demo.lightyard.example`, PASSWORD)).status).toBe(200);
  return c;
}

async function newListing(opts: { live?: boolean } = {}): Promise<string> {
  const { buildListing } = await import('../../src/server/db/factories');
  const base = {
    labId: sellerLabId,
    category: 'cavity-mirror' as const,
    title: 'Spare HR mirror, 1064 nm',
    condition: 'like-new' as const,
    quantity: 2,
    priceCents: 45000,
    currency: 'EUR',
    shipsTo: ['EU' as const],
    specs: { diameterMm: 25.4 },
  };
  const published = opts.live
    ? {
        title: base.title,
        description: '',
        condition: base.condition,
        priceCents: base.priceCents,
        currency: base.currency,
        shipsTo: base.shipsTo,
        specs: base.specs,
        approvedAt: Date.now(),
      }
    : null;
  const { id } = await buildListing({ ...base, status: opts.live ? 'live' : 'draft', published });
  return id;
}

async function keysUnder(listingId: string): Promise<string[]> {
  const page = await s3.send(new ListObjectsV2Command({ Bucket: app.env.S3_BUCKET, Prefix: `listings/${listingId}/` }));
  return (page.Contents ?? []).map((o) => o.Key!).sort();
}

interface UploadSpec {
  kind: 'photo' | 'datasheet' | 'measurement';
  filename: string;
  contentType: string;
  size: number;
  measurementKind?: string;
}

function startUpload(client: Client, listingId: string, spec: UploadSpec) {
  return client.post(`/api/listings/${listingId}/uploads`, spec);
}

/** What a browser does: declare the file, PUT the bytes to the presigned URL, ask the server to check them. */
async function uploadFile(listingId: string, spec: Omit<UploadSpec, 'size'> & { size?: number }, bytes: Buffer, client = seller) {
  const created = await startUpload(client, listingId, { ...spec, size: spec.size ?? bytes.byteLength });
  expect(created.status).toBe(201);
  const { fileId, uploadUrl } = (await created.json()) as { fileId: string; uploadUrl: string };
  const put = await fetch(uploadUrl, { method: 'PUT', headers: { 'content-type': spec.contentType }, body: new Uint8Array(bytes) });
  expect(put.status).toBe(200);
  const complete = await client.post(`/api/listings/${listingId}/uploads/${fileId}/complete`);
  return { fileId, uploadUrl, complete, body: await complete.json() };
}

async function download(client: Client, fileId: string, variant: string): Promise<{ bytes: Buffer; headers: Headers }> {
  const redirect = await client.get(`/api/files/${fileId}?variant=${variant}`);
  expect(redirect.status).toBe(302);
  const res = await fetch(redirect.headers.get('location')!);
  expect(res.status).toBe(200);
  return { bytes: Buffer.from(await res.arrayBuffer()), headers: res.headers };
}

function pngChunk(type: string, data: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([length, body, crc]);
}

/** A 69-byte PNG whose IHDR claims the given canvas: decoding it would allocate width × height × 3 bytes. */
function pngClaiming(width: number, height: number): Buffer {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(width, 0);
  ihdr.writeUInt32BE(height, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // RGB
  const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([
    signature,
    pngChunk('IHDR', ihdr),
    pngChunk('IDAT', deflateSync(Buffer.alloc(64))),
    pngChunk('IEND', Buffer.alloc(0)),
  ]);
}

const PDF = Buffer.from(
  '%PDF-1.4\n1 0 obj << /Type /Catalog /Pages 2 0 R >> endobj\n2 0 obj << /Type /Pages /Kids [] /Count 0 >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n',
);

describe('accepted uploads', () => {
  test('a PNG goes up through a presigned PUT and is served re-encoded, with WebP thumbnails 320 and 1280 px wide', async () => {
    const listingId = await newListing();
    const png = await sharp({ create: { width: 2000, height: 1000, channels: 3, background: '#2a6f97' } })
      .png()
      .toBuffer();
    const { fileId, uploadUrl, complete, body } = await uploadFile(
      listingId,
      { kind: 'photo', filename: 'mirror.png', contentType: 'image/png' },
      png,
    );

    const signed = new URL(uploadUrl).searchParams;
    expect(signed.get('X-Amz-Expires')).toBe('300');
    expect(signed.get('X-Amz-SignedHeaders')).toBe('content-length;content-type;host');
    expect(complete.status).toBe(200);
    expect(body).toMatchObject({
      id: fileId,
      listingId,
      kind: 'photo',
      filename: 'mirror.png',
      contentType: 'image/png',
      size: png.byteLength,
      width: 2000,
      height: 1000,
    });
    expect(body.urls).toEqual({
      full: `/api/files/${fileId}?variant=full`,
      w1280: `/api/files/${fileId}?variant=w1280`,
      w320: `/api/files/${fileId}?variant=w320`,
      original: `/api/files/${fileId}?variant=original`,
    });
    // the upload itself is gone; only what the server wrote remains
    expect(await keysUnder(listingId)).toEqual([
      `listings/${listingId}/${fileId}/full.png`,
      `listings/${listingId}/${fileId}/w1280.webp`,
      `listings/${listingId}/${fileId}/w320.webp`,
    ]);

    const sizes = await Promise.all(
      ['full', 'w1280', 'w320'].map(async (v) => {
        const { bytes, headers } = await download(seller, fileId, v);
        const m = await sharp(bytes).metadata();
        return [v, m.format, m.width, m.height, headers.get('content-type')];
      }),
    );
    expect(sizes).toEqual([
      ['full', 'png', 2000, 1000, 'image/png'],
      ['w1280', 'webp', 1280, 640, 'image/webp'],
      ['w320', 'webp', 320, 160, 'image/webp'],
    ]);

    const again = await seller.post(`/api/listings/${listingId}/uploads/${fileId}/complete`);
    expect(again.status).toBe(200);
    expect(await again.json()).toEqual(body);
  });

  test('a JPEG loses its EXIF and GPS data, is turned upright, and a small one is not upscaled', async () => {
    const listingId = await newListing();
    const jpeg = await sharp({ create: { width: 400, height: 200, channels: 3, background: '#c0392b' } })
      .jpeg()
      .withMetadata({ orientation: 6 })
      .withExif({
        IFD0: { Copyright: 'Secret Lab Inventory', Artist: 'Ingrid Solvang' },
        IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '59/1 54/1 0/1' },
      })
      .toBuffer();
    const source = await sharp(jpeg).metadata();
    expect(source.orientation).toBe(6);
    expect(jpeg.includes('Secret Lab Inventory')).toBe(true);

    const { fileId, complete, body } = await uploadFile(
      listingId,
      { kind: 'photo', filename: 'IMG_0042.JPG', contentType: 'image/jpeg' },
      jpeg,
    );
    expect(complete.status).toBe(200);
    expect(body).toMatchObject({ contentType: 'image/jpeg', width: 200, height: 400 });

    for (const variant of ['full', 'w1280', 'w320']) {
      const { bytes } = await download(seller, fileId, variant);
      const m = await sharp(bytes).metadata();
      expect({ variant, format: m.format, width: m.width, height: m.height, exif: m.exif, orientation: m.orientation }).toEqual({
        variant,
        format: variant === 'full' ? 'jpeg' : 'webp',
        width: 200,
        height: 400,
        exif: undefined,
        orientation: undefined,
      });
      expect(bytes.includes('Secret Lab Inventory')).toBe(false);
      expect(bytes.includes('Ingrid Solvang')).toBe(false);
    }
    const original = await download(seller, fileId, 'original');
    expect(original.headers.get('content-disposition')).toBe(`attachment; filename="IMG_0042.jpg"; filename*=UTF-8''IMG_0042.jpg`);
    expect(original.bytes.includes('Secret Lab Inventory')).toBe(false);
  });

  test('a datasheet PDF is kept as uploaded and served as a download; a newer one replaces it once accepted', async () => {
    const listingId = await newListing();
    const first = await uploadFile(
      listingId,
      { kind: 'datasheet', filename: 'HR-1064 datasheet.pdf', contentType: 'application/pdf' },
      PDF,
    );
    expect(first.complete.status).toBe(200);
    expect(first.body).toMatchObject({
      kind: 'datasheet',
      contentType: 'application/pdf',
      width: null,
      height: null,
      urls: { original: `/api/files/${first.fileId}?variant=original` },
    });
    const { bytes, headers } = await download(seller, first.fileId, 'original');
    expect(bytes.equals(PDF)).toBe(true);
    expect(headers.get('content-type')).toBe('application/pdf');
    expect(headers.get('content-disposition')).toMatch(/^attachment; filename="HR-1064 datasheet.pdf"/);
    expect((await seller.get(`/api/files/${first.fileId}?variant=w320`)).status).toBe(404);

    const second = await uploadFile(listingId, { kind: 'datasheet', filename: 'v2.pdf', contentType: 'application/pdf' }, PDF);
    expect(second.complete.status).toBe(200);
    expect(await keysUnder(listingId)).toEqual([`listings/${listingId}/${second.fileId}/original`]);
    expect((await seller.get(`/api/files/${first.fileId}`)).status).toBe(404);
  });

  test('a ring-down CSV is parsed and fitted, and its data kept with the file', async () => {
    const listingId = await newListing();
    const tauUs = 12.5;
    const rows = Array.from({ length: 400 }, (_, i) => `${(i * 0.2).toFixed(1)},${Math.exp(-(i * 0.2) / tauUs).toFixed(6)}`);
    const csv = Buffer.from(['# length_m=0.1', 'time_us,intensity', ...rows, ''].join('\n'));
    const { fileId, complete, body } = await uploadFile(
      listingId,
      { kind: 'measurement', measurementKind: 'ringdown', filename: 'ringdown.csv', contentType: 'text/csv' },
      csv,
    );
    expect(complete.status).toBe(200);
    expect(body).toMatchObject({
      kind: 'measurement',
      measurementKind: 'ringdown',
      contentType: 'text/csv',
      urls: { original: `/api/files/${fileId}?variant=original` },
    });
    expect(body.data.kind).toBe('ringdown');
    expect(body.data.points).toHaveLength(400);
    expect(body.data.fit.tauS).toBeCloseTo(tauUs * 1e-6, 8);
    expect(body.data.figures.lengthM).toBe(0.1);
    const { bytes, headers } = await download(seller, fileId, 'original');
    expect(bytes.equals(csv)).toBe(true);
    expect(headers.get('content-type')).toBe('text/csv; charset=utf-8');
  });
});

describe('refused uploads: a clear message, and nothing left in storage', () => {
  async function expectRefused(listingId: string, spec: Omit<UploadSpec, 'size'> & { size?: number }, bytes: Buffer, message: RegExp) {
    const { fileId, complete, body } = await uploadFile(listingId, spec, bytes);
    expect(complete.status).toBe(422);
    expect(body.error.code).toBe('unprocessable');
    expect(body.error.message).toMatch(message);
    expect(await keysUnder(listingId)).toEqual([]);
    // the refusal sticks, and the file is not served
    const again = await seller.post(`/api/listings/${listingId}/uploads/${fileId}/complete`);
    expect(again.status).toBe(422);
    expect((await again.json()).error.message).toBe(body.error.message);
    expect((await seller.get(`/api/files/${fileId}`)).status).toBe(404);
  }

  test('a PNG whose header claims 20 000 × 20 000 px', async () => {
    const bomb = pngClaiming(20_000, 20_000);
    expect((await sharp(bomb, { limitInputPixels: false }).metadata()).width).toBe(20_000);
    await expectRefused(
      await newListing(),
      { kind: 'photo', filename: 'huge.png', contentType: 'image/png' },
      bomb,
      /^This image is 20.000 × 20.000 px; photos may be at most 12.000 px per side and 60 megapixels\.$/,
    );
  });

  test('a PDF renamed .jpg and declared image/jpeg', async () => {
    await expectRefused(
      await newListing(),
      { kind: 'photo', filename: 'photo.jpg', contentType: 'image/jpeg' },
      PDF,
      /^This file is a PDF document, not a JPEG, PNG or WebP image\.$/,
    );
  });

  test('an SVG with a script, declared as a PNG or as what it is', async () => {
    const svg = Buffer.from(
      '<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(document.cookie)</script></svg>\n',
    );
    const listingId = await newListing();
    await expectRefused(
      listingId,
      { kind: 'photo', filename: 'mirror.png', contentType: 'image/png' },
      svg,
      /^This file is SVG, HTML or XML markup, not a JPEG, PNG or WebP image\.$/,
    );

    const declared = await startUpload(seller, listingId, {
      kind: 'photo',
      filename: 'mirror.svg',
      contentType: 'image/svg+xml',
      size: svg.byteLength,
    });
    expect(declared.status).toBe(415);
    expect((await declared.json()).error).toMatchObject({
      message: 'Photos must be JPEG, PNG or WebP images, not image/svg+xml.',
      fields: { contentType: expect.any(String) },
    });
    expect(await keysUnder(listingId)).toEqual([]);
  });

  test('a 16 MB photo: refused by its declared size, and also when it was declared small', async () => {
    const listingId = await newListing();
    const declared = await startUpload(seller, listingId, { kind: 'photo', filename: 'big.jpg', contentType: 'image/jpeg', size: 16 * MB });
    expect(declared.status).toBe(413);
    expect((await declared.json()).error).toMatchObject({
      code: 'payload_too_large',
      message: 'Photos may be at most 15 MB; this file is 16 MB.',
    });
    expect(await keysUnder(listingId)).toEqual([]);

    const big = Buffer.alloc(16 * MB, 0x41);
    big.set([0xff, 0xd8, 0xff, 0xe0]);
    await expectRefused(
      listingId,
      { kind: 'photo', filename: 'small.jpg', contentType: 'image/jpeg', size: 1000 },
      big,
      /^The stored file is 16 MB, but 1000 bytes were declared\. Photos may be at most 15 MB\.$/,
    );
  });

  test('a CSV of 10⁶ lines', async () => {
    const csv = Buffer.from('time_us,intensity\n' + '0,1\n'.repeat(1_000_000));
    expect(csv.byteLength).toBeLessThan(5 * MB);
    await expectRefused(
      await newListing(),
      { kind: 'measurement', measurementKind: 'ringdown', filename: 'scope-dump.csv', contentType: 'text/csv' },
      csv,
      /^Line 200001: The file has 1.000.001 lines; measurement files are limited to 200.000 lines\./,
    );
  });

  test('a CSV with a bad cell names its line and column', async () => {
    const csv = Buffer.from('time_us,intensity\n0,1\n0.1,0.99\n0.2,n/a\n');
    await expectRefused(
      await newListing(),
      { kind: 'measurement', measurementKind: 'ringdown', filename: 'trace.csv', contentType: 'text/csv' },
      csv,
      /^Line 4, column 2: "n\/a" is not a number \(intensity\)\.$/,
    );
  });
});

describe('who may upload, and the limits', () => {
  const photo = { kind: 'photo', filename: 'a.png', contentType: 'image/png', size: 1000 } as const;

  test('anonymous 401; a buyer, and the owner of another lab, 403; an unknown listing 404', async () => {
    const listingId = await newListing();
    expect((await startUpload(new Client(app.origin), listingId, photo)).status).toBe(401);
    for (const who of ['buyer', 'seller2']) {
      const r = await startUpload(await as(who), listingId, photo);
      expect(r.status).toBe(403);
      expect((await r.json()).error.code).toBe('forbidden');
    }
    expect((await startUpload(seller, crypto.randomUUID(), photo)).status).toBe(404);
    expect(await keysUnder(listingId)).toEqual([]);
  });

  test('a bad declaration answers 400 with the field named', async () => {
    const listingId = await newListing();
    const r = await startUpload(seller, listingId, { kind: 'measurement', filename: 'trace.csv', contentType: 'text/csv', size: 100 });
    expect(r.status).toBe(400);
    expect((await r.json()).error.fields).toEqual({
      measurementKind: 'Say what the measurement is: spectrum, ringdown or efficiency-curve.',
    });
  });

  test('the 13th photo is refused', async () => {
    const listingId = await newListing();
    for (let i = 0; i < 12; i++) expect((await startUpload(seller, listingId, photo)).status).toBe(201);
    const r = await startUpload(seller, listingId, photo);
    expect(r.status).toBe(409);
    expect((await r.json()).error.message).toBe('A listing has at most 12 photos. Remove one before adding another.');
  });

  test('a wrong, foreign or expired fileId answers 404, and the expired upload is cleaned away', async () => {
    const listingId = await newListing();
    const other = await newListing();
    expect((await seller.post(`/api/listings/${listingId}/uploads/${crypto.randomUUID()}/complete`)).status).toBe(404);

    const created = await (await startUpload(seller, other, photo)).json();
    expect((await seller.post(`/api/listings/${listingId}/uploads/${created.fileId}/complete`)).status).toBe(404);

    const png = await sharp({ create: { width: 10, height: 10, channels: 3, background: '#fff' } })
      .png()
      .toBuffer();
    const { fileId, uploadUrl } = await (await startUpload(seller, listingId, { ...photo, size: png.byteLength })).json();
    expect((await fetch(uploadUrl, { method: 'PUT', headers: { 'content-type': 'image/png' }, body: new Uint8Array(png) })).status).toBe(
      200,
    );
    const { getClient } = await import('../../src/server/db/client');
    await getClient().execute({ sql: 'UPDATE listing_files SET created_at = created_at - 2 * 3600 * 1000 WHERE id = ?', args: [fileId] });
    const expired = await seller.post(`/api/listings/${listingId}/uploads/${fileId}/complete`);
    expect(expired.status).toBe(404);
    expect((await expired.json()).error.message).toBe('This upload has expired. Start it again.');
    expect(await keysUnder(listingId)).toEqual([]);
  });
});

describe('serving and removing files', () => {
  async function photoOn(listingId: string): Promise<string> {
    const png = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#123' } })
      .png()
      .toBuffer();
    const { fileId, complete } = await uploadFile(listingId, { kind: 'photo', filename: 'p.png', contentType: 'image/png' }, png);
    expect(complete.status).toBe(200);
    return fileId;
  }

  test('a live listing’s photos are open to everyone; an unpublished one’s only to its lab and moderators', async () => {
    const live = await photoOn(await newListing({ live: true }));
    const draft = await photoOn(await newListing());
    const anon = new Client(app.origin);
    const buyer = await as('buyer');
    const moderator = await as('moderator');

    const anonLive = await anon.get(`/api/files/${live}?variant=w320`);
    expect(anonLive.status).toBe(302);
    expect(new URL(anonLive.headers.get('location')!).searchParams.get('X-Amz-Expires')).toBe('300');
    expect((await anon.get(`/api/files/${draft}`)).status).toBe(401);
    expect((await buyer.get(`/api/files/${draft}`)).status).toBe(404);
    expect((await moderator.get(`/api/files/${draft}`)).status).toBe(302);
    expect((await seller.get(`/api/files/${draft}`)).status).toBe(302);
    expect((await anon.get(`/api/files/${crypto.randomUUID()}`)).status).toBe(404);
    expect((await anon.get(`/api/files/${live}?variant=huge`)).status).toBe(400);
  });

  test('removing a file takes its objects with it; only the lab may remove', async () => {
    const listingId = await newListing({ live: true });
    const fileId = await photoOn(listingId);
    expect((await (await as('buyer')).del(`/api/listings/${listingId}/uploads/${fileId}`)).status).toBe(403);
    expect((await keysUnder(listingId)).length).toBe(3);
    const r = await seller.del(`/api/listings/${listingId}/uploads/${fileId}`);
    expect(r.status).toBe(200);
    expect(await keysUnder(listingId)).toEqual([]);
    expect((await new Client(app.origin).get(`/api/files/${fileId}`)).status).toBe(404);
  });
});

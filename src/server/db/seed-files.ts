/**
 * Photos and measurement files for the demo listings, sent through the same upload pipeline a
 * browser uses (declare, store, complete), so they are checked, re-encoded and parsed like any other.
 */
import { eq } from 'drizzle-orm';
import type { MeasurementKind } from '../../lib/listings/constants';
import { loadCurrentUser } from '../auth/users';
import { completeUpload, createUpload } from '../listings/uploads';
import { putObject } from '../storage/objects';
import { getDb } from './client';
import { listingFiles, listings } from './schema';
import type { DemoListing } from './seed-listings';
import { efficiencyCsv, partPhoto, ringdownCsv, spectrumCsv, tauForMirrorLoss } from './synthetic';

interface SeedFile {
  kind: 'photo' | 'measurement';
  measurementKind?: MeasurementKind;
  filename: string;
  contentType: string;
  bytes: Buffer;
}

async function attach(userId: string, listingId: string, f: SeedFile) {
  const user = (await loadCurrentUser(userId))!;
  const [listing] = await getDb().select().from(listings).where(eq(listings.id, listingId));
  const { fileId } = await createUpload(user, listing!, {
    kind: f.kind,
    filename: f.filename,
    contentType: f.contentType,
    size: f.bytes.length,
    ...(f.measurementKind ? { measurementKind: f.measurementKind } : {}),
  });
  const [row] = await getDb().select({ key: listingFiles.storageKey }).from(listingFiles).where(eq(listingFiles.id, fileId));
  await putObject(row!.key, f.bytes, f.contentType);
  await completeUpload(user, listing!, fileId);
}

function measurementFiles(d: DemoListing, seed: number): SeedFile[] {
  // the demo's mirrors and detectors carry these fields (seed-listings.ts)
  const s = d.specs as {
    designWavelengthNm: number;
    bandMinNm: number;
    bandMaxNm: number;
    transmissionPpm: { value: number };
    lossPpm: { value: number };
    wavelengthNm: number;
    quantumEfficiency?: { value: number };
    efficiency?: { value: number };
  };
  const csv = (name: string, kind: MeasurementKind, text: string): SeedFile => ({
    kind: 'measurement',
    measurementKind: kind,
    filename: name,
    contentType: 'text/csv',
    bytes: Buffer.from(text),
  });
  return (d.measurements ?? []).map((m) => {
    if (m === 'ringdown') {
      // measured a little better than the conservative spec, as sellers' own traces often are
      const perMirror = (s.transmissionPpm.value + s.lossPpm.value) * 0.92;
      return csv(
        'ringdown-50mm.csv',
        'ringdown',
        ringdownCsv({ tauS: tauForMirrorLoss(perMirror, 0.05), lengthM: 0.05, wavelengthNm: s.designWavelengthNm, seed }),
      );
    }
    if (m === 'spectrum') {
      return csv(
        'transmission-spectrum.csv',
        'spectrum',
        spectrumCsv({
          bandMinNm: s.bandMinNm,
          bandMaxNm: s.bandMaxNm,
          transmissionPpm: s.transmissionPpm.value,
          lossPpm: s.lossPpm.value,
          seed,
        }),
      );
    }
    const eff = (s.quantumEfficiency ?? s.efficiency)?.value ?? 0.8;
    return csv('efficiency-curve.csv', 'efficiency-curve', efficiencyCsv({ wavelengthNm: s.wavelengthNm, efficiency: eff, seed }));
  });
}

export async function seedListingFiles(created: { id: string; demo: DemoListing }[], createdBy: Record<DemoListing['lab'], string>) {
  for (const [i, { id, demo }] of created.entries()) {
    const userId = createdBy[demo.lab];
    await attach(userId, id, {
      kind: 'photo',
      filename: 'photo-1.jpg',
      contentType: 'image/jpeg',
      bytes: await partPhoto(demo.category, i + 1),
    });
    for (const f of measurementFiles(demo, i + 1)) await attach(userId, id, f);
  }
}

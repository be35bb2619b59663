/** Request bodies the tests create listings with: a plain 852 nm cavity mirror unless told otherwise. */

export interface MirrorBodyOptions {
  quantity?: number;
  priceCents?: number;
  description?: string;
}

/** A `POST /api/listings` body for a cavity mirror (852 nm, ROC 100 mm, T 3 ppm, loss 2 ppm, ships worldwide). */
export function mirrorListing(title: string, options: number | MirrorBodyOptions = {}) {
  const o = typeof options === 'number' ? { quantity: options } : options;
  return {
    category: 'cavity-mirror',
    title,
    description: o.description ?? 'For the access and input tests.',
    condition: 'new',
    quantity: o.quantity ?? 1,
    priceCents: o.priceCents ?? 10_000,
    currency: 'EUR',
    shipsTo: ['WORLD'],
    specs: {
      diameterMm: 7.75,
      substrate: 'fused silica',
      rocMm: 100,
      designWavelengthNm: 852,
      bandMinNm: 830,
      bandMaxNm: 870,
      transmissionPpm: { value: 3 },
      lossPpm: { value: 2 },
      aoiDeg: 0,
    },
  };
}

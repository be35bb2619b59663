import { z } from 'zod';
import { REGIONS } from '../listings/constants';

export const CartItemSchema = z.object({
  listingId: z.string().min(1, 'Say which listing.').max(64),
  quantity: z.number().int('Whole units only.').min(1, 'At least one.').max(1000),
});

export const CheckoutSchema = z.object({
  /** Where the parts go; defaults to the region of the buyer's lab. */
  shipTo: z.enum(REGIONS).optional(),
  /** End-use statements for export-controlled listings, by listing id. */
  endUse: z.record(z.string().trim().min(20, 'Describe the end use in a sentence or two.').max(2000)).optional(),
});

export const ShipSchema = z.object({
  carrier: z.string().trim().min(2, 'Name the carrier.').max(80),
  trackingNumber: z.string().trim().min(3, 'Give the tracking number.').max(80),
});

export const RefundSchema = z.object({
  amountCents: z.number().int().positive('A refund is more than zero.').optional(),
  reason: z.string().trim().min(5, 'Say why.').max(2000),
});

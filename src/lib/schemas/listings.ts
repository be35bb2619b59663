import { z } from 'zod';
import { CATEGORIES, HAZARDS, LISTING_STATUSES } from '../listings/constants';

export const ListingQuerySchema = z.object({
  mine: z.enum(['0', '1']).optional(),
  q: z.string().trim().max(200).optional(),
  category: z.enum(CATEGORIES).optional(),
  status: z.enum(LISTING_STATUSES).optional(),
  limit: z.coerce.number().int().min(1).max(100).default(24),
  offset: z.coerce.number().int().min(0).max(100_000).default(0),
});

export const ModerationSchema = z.object({
  action: z.enum(['approve', 'request-changes', 'reject'], { errorMap: () => ({ message: 'Choose approve, request-changes or reject.' }) }),
  reason: z.string().trim().max(4000, 'Use at most 4000 characters.').optional(),
});

export const FlagsSchema = z.object({
  hazards: z
    .array(z.enum(HAZARDS))
    .max(HAZARDS.length)
    .refine((a) => new Set(a).size === a.length, 'List each hazard once.'),
  exportControlled: z.boolean(),
  exportNote: z.string().trim().max(500).nullable().optional(),
});

export const QuestionSchema = z.object({
  body: z.string().trim().min(2, 'Write your question.').max(4000, 'Use at most 4000 characters.'),
});

export const ReportSchema = z.object({
  reason: z.string().trim().min(5, 'Say what is wrong with this listing.').max(2000, 'Use at most 2000 characters.'),
});

export const VersionSchema = z.object({ version: z.number().int().positive().optional() });

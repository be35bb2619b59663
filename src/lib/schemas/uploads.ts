/** What the browser declares when it starts an upload; the server then judges the real bytes. */
import { z } from 'zod';
import { FILE_KINDS, MEASUREMENT_KINDS, type FileKind } from '../listings/constants';

const MB = 1024 * 1024;

/** Declared types and size limits per kind, shared by the upload form and the server. */
export const UPLOAD_LIMITS: Record<FileKind, { declaredTypes: readonly string[]; maxBytes: number }> = {
  photo: { declaredTypes: ['image/jpeg', 'image/png', 'image/webp'], maxBytes: 15 * MB },
  datasheet: { declaredTypes: ['application/pdf'], maxBytes: 20 * MB },
  // browsers label CSV files differently depending on the installed spreadsheet program
  measurement: { declaredTypes: ['text/csv', 'application/csv', 'application/vnd.ms-excel', 'text/plain'], maxBytes: 5 * MB },
};

export const MAX_PHOTOS_PER_LISTING = 12;

export const CreateUploadSchema = z
  .object({
    kind: z.enum(FILE_KINDS, { errorMap: () => ({ message: 'Choose photo, datasheet or measurement.' }) }),
    filename: z
      .string()
      .max(255, 'Use a file name of at most 255 characters.')
      .transform((name) => name.split(/[\\/]/).pop()!.trim())
      .refine((name) => name.length > 0, 'Give the file a name.')
      .refine((name) => !/[\u0000-\u001f\u007f]/.test(name), 'The file name contains control characters.'),
    contentType: z.string().min(1, 'Say what type the file is.').max(100),
    size: z.number().int('Give the size in bytes.').positive('The file is empty.'),
    measurementKind: z
      .enum(MEASUREMENT_KINDS, { errorMap: () => ({ message: 'Choose spectrum, ringdown or efficiency-curve.' }) })
      .optional(),
  })
  .superRefine((v, ctx) => {
    if (v.kind === 'measurement' && !v.measurementKind) {
      ctx.addIssue({
        code: 'custom',
        path: ['measurementKind'],
        message: 'Say what the measurement is: spectrum, ringdown or efficiency-curve.',
      });
    }
    if (v.kind !== 'measurement' && v.measurementKind) {
      ctx.addIssue({ code: 'custom', path: ['measurementKind'], message: 'Only measurement files have a measurement kind.' });
    }
  });
export type CreateUpload = z.infer<typeof CreateUploadSchema>;

const FILE_VARIANTS = ['full', 'w320', 'w1280', 'original'] as const;
export type FileVariant = (typeof FILE_VARIANTS)[number];
export const FileQuerySchema = z.object({
  variant: z.enum(FILE_VARIANTS, { errorMap: () => ({ message: 'Choose full, w1280, w320 or original.' }) }).optional(),
});

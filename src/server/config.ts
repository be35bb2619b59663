import { z } from 'zod';

const flag = z
  .enum(['0', '1', 'true', 'false', ''])
  .default('0')
  .transform((v) => v === '1' || v === 'true');

export const ConfigSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  APP_ORIGIN: z.string().url().default('http://localhost:4321'),
  DATABASE_URL: z
    .string()
    .regex(/^(file:|libsql:|https?:|wss?:)/, 'must be a file:, libsql:, http(s): or ws(s): URL')
    .default('file:./data/lightyard.db'),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: flag,
  SMTP_IGNORE_TLS: flag,
  MAIL_FROM: z.string().default('Lightyard <no-reply@lightyard.example>'),
  MAIL_DIR: z.string().default('./data/mail'),
  /** The outbox's first retry delay after a failed delivery, ms; each further attempt doubles it (capped at 10 minutes). */
  MAIL_RETRY_BASE_MS: z.coerce.number().int().min(100).max(600_000).default(5000),
  S3_ENDPOINT: z.string().url().optional(),
  S3_REGION: z.string().default('us-east-1'),
  S3_BUCKET: z.string().default('lightyard'),
  S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
  STRIPE_SECRET_KEY: z.string().default('sk_test_lightyard_fake'),
  STRIPE_API_BASE: z.string().url().optional(),
  STRIPE_WEBHOOK_SECRET: z.string().default('whsec_lightyard_local_fake'),
  /** Platform fee in basis points of the order subtotal (800 = 8 %). */
  PLATFORM_FEE_BPS: z.coerce.number().int().min(0).max(5000).default(800),
  /** How long checkout holds the stock, seconds (30 minutes). */
  RESERVATION_SECONDS: z.coerce.number().int().min(1).max(86_400).default(1800),
  /** How often the background jobs run (reservations, inspection windows), ms. */
  JOBS_INTERVAL_MS: z.coerce.number().int().min(200).max(3_600_000).default(60_000),
  /** The buyer's inspection window after shipping, days. */
  INSPECTION_DAYS: z.coerce.number().int().min(1).max(90).default(14),
  FAKES: flag,
  TRUST_PROXY: flag,
});

export type Config = z.infer<typeof ConfigSchema>;

let cached: Config | undefined;

/** Parses the environment once; a bad value stops the app with the variable named. */
export function getConfig(): Config {
  if (cached) return cached;
  const parsed = ConfigSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`);
    throw new Error(`Invalid configuration:\n${lines.join('\n')}`);
  }
  cached = parsed.data;
  return cached;
}

export function isSecureOrigin(config: Config = getConfig()): boolean {
  return config.APP_ORIGIN.startsWith('https://');
}

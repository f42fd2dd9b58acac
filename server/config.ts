/** Server configuration from the environment. Every variable is listed in README.md and DEVELOPERS.md. */
import { z } from 'zod';

const ConfigSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().min(1),
  JWT_SECRET: z.string().min(32).default('brineline-development-secret-change-me-0123456789'),
  PUBLIC_URL: z.string().url().optional(),
  SMTP_URL: z.string().default('smtp://127.0.0.1:2525'),
  MAIL_FROM: z.string().default('Brineline <no-reply@brineline.invalid>'),
  S3_ENDPOINT: z.string().default('http://127.0.0.1:4569'),
  S3_BUCKET: z.string().default('brineline-photos'),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().default('S3RVER'),
  S3_SECRET_ACCESS_KEY: z.string().default('S3RVER'),
  BCRYPT_COST: z.coerce.number().int().min(4).max(15).default(12),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  DEV_MAIL_DIR: z.string().optional(),
  /** Sign-in and password-reset requests allowed per e-mail address and IP address in one window. */
  RATE_LIMIT_PER_EMAIL: z.coerce.number().int().min(1).default(10),
  /** The same requests allowed per IP address in one window, whatever the e-mail. */
  RATE_LIMIT_PER_IP: z.coerce.number().int().min(1).default(50),
  RATE_LIMIT_WINDOW_MINUTES: z.coerce.number().int().min(1).default(15),
  /** How long a device stays signed in without use (each refresh starts the period again). */
  REFRESH_TTL_DAYS: z.coerce.number().int().min(1).max(365).default(30),
});

export type Config = z.infer<typeof ConfigSchema> & { publicUrl: string };

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = ConfigSchema.safeParse(env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join('.')}: ${i.message}`).join('\n');
    throw new Error(`Invalid environment:\n${lines}`);
  }
  const c = parsed.data;
  if (c.NODE_ENV === 'production' && c.BCRYPT_COST < 12) throw new Error('BCRYPT_COST must be at least 12 in production.');
  return { ...c, publicUrl: c.PUBLIC_URL ?? `http://localhost:${c.PORT}` };
}

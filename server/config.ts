/** Server configuration from the environment. Every variable is listed in README.md and DEVELOPERS.md. */
import { z } from 'zod';
import { formatIssueLines } from '@shared/api/format-issues';

/**
 * Values written in this repository for development and tests. They are public, so a production
 * server refuses them: a token signed with a published key would impersonate any member.
 */
export const DEVELOPMENT_JWT_SECRET = 'brineline-development-secret-change-me-0123456789';
const PUBLISHED_SECRETS = new Set([DEVELOPMENT_JWT_SECRET, 'test-secret-test-secret-test-secret-0123456789']);
const DEVELOPMENT_S3_KEY = 'S3RVER';
/** Production keys: at least this many characters, and not a short pattern repeated. */
export const MIN_PRODUCTION_SECRET_LENGTH = 32;
const MIN_DISTINCT_SECRET_CHARACTERS = 12;

const ConfigSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  DATABASE_URL: z.string().min(1),
  JWT_SECRET: z.string().min(32).optional(),
  PUBLIC_URL: z.string().url().optional(),
  SMTP_URL: z.string().default('smtp://127.0.0.1:2525'),
  MAIL_FROM: z.string().default('Brineline <no-reply@brineline.invalid>'),
  S3_ENDPOINT: z.string().default('http://127.0.0.1:4569'),
  S3_BUCKET: z.string().default('brineline-photos'),
  S3_REGION: z.string().default('us-east-1'),
  S3_ACCESS_KEY_ID: z.string().default(DEVELOPMENT_S3_KEY),
  S3_SECRET_ACCESS_KEY: z.string().default(DEVELOPMENT_S3_KEY),
  BCRYPT_COST: z.coerce.number().int().min(4).max(15).default(12),
  LOG_LEVEL: z.enum(['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent']).default('info'),
  DEV_MAIL_DIR: z.string().optional(),
  /** Sign-in and password-reset requests allowed per e-mail address and IP address in one window. */
  RATE_LIMIT_PER_EMAIL: z.coerce.number().int().min(1).default(10),
  /** The same requests allowed per IP address in one window, whatever the e-mail. */
  RATE_LIMIT_PER_IP: z.coerce.number().int().min(1).default(50),
  RATE_LIMIT_WINDOW_MINUTES: z.coerce.number().int().min(1).default(15),
  /** Failed sign-ins to one account (from any address) before each further one doubles its wait. */
  RATE_LIMIT_PER_ACCOUNT: z.coerce.number().int().min(1).default(5),
  /** How long a device stays signed in without use (each refresh starts the period again). */
  REFRESH_TTL_DAYS: z.coerce.number().int().min(1).max(365).default(30),
});

export type Config = Omit<z.infer<typeof ConfigSchema>, 'JWT_SECRET'> & { JWT_SECRET: string; publicUrl: string };

/** What a production environment must not carry; each line says which variable and why. */
function productionProblems(c: z.infer<typeof ConfigSchema>, env: NodeJS.ProcessEnv): string[] {
  const problems: string[] = [];
  const secret = c.JWT_SECRET;
  if (!secret) problems.push('JWT_SECRET: required in production (a random key of 32 or more characters).');
  else if (PUBLISHED_SECRETS.has(secret)) problems.push('JWT_SECRET: this is the published development key; set a random one.');
  else if (secret.length < MIN_PRODUCTION_SECRET_LENGTH || new Set(secret).size < MIN_DISTINCT_SECRET_CHARACTERS) {
    problems.push(`JWT_SECRET: too weak; use a random key of ${MIN_PRODUCTION_SECRET_LENGTH} or more characters.`);
  }
  if (c.BCRYPT_COST < 12) problems.push('BCRYPT_COST: must be at least 12 in production.');
  if (!c.PUBLIC_URL) problems.push('PUBLIC_URL: required in production (links in e-mails would point at localhost).');
  if (!env.S3_ENDPOINT) problems.push('S3_ENDPOINT: required in production (the default is the local development store).');
  if (c.S3_ACCESS_KEY_ID === DEVELOPMENT_S3_KEY || c.S3_SECRET_ACCESS_KEY === DEVELOPMENT_S3_KEY) {
    problems.push('S3_ACCESS_KEY_ID, S3_SECRET_ACCESS_KEY: the development store\'s keys; set the real ones.');
  }
  if (!env.SMTP_URL) problems.push('SMTP_URL: required in production (the default is the local mail catcher).');
  if (c.DEV_MAIL_DIR) problems.push('DEV_MAIL_DIR: the development mailbox must not be set in production.');
  return problems;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): Config {
  const parsed = ConfigSchema.safeParse(env);
  if (!parsed.success) {
    const lines = formatIssueLines(parsed.error).map((l) => `  ${l}`).join('\n');
    throw new Error(`Invalid environment:\n${lines}`);
  }
  const c = parsed.data;
  if (c.NODE_ENV === 'production') {
    const problems = productionProblems(c, env);
    if (problems.length) throw new Error(`Refusing to start in production:\n${problems.map((p) => `  ${p}`).join('\n')}`);
  }
  return { ...c, JWT_SECRET: c.JWT_SECRET ?? DEVELOPMENT_JWT_SECRET, publicUrl: c.PUBLIC_URL ?? `http://localhost:${c.PORT}` };
}

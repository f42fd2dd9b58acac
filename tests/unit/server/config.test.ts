/** F2: a production server refuses development secrets and defaults that matter. */
import { describe, expect, it } from 'vitest';
import { DEVELOPMENT_JWT_SECRET, loadConfig } from '../../../server/config';

const productionEnv = {
  NODE_ENV: 'production',
  DATABASE_URL: 'postgres://brineline@db.internal/brineline',
  JWT_SECRET: 'q8V1mZ3rT6wY9bN2kF5hJ7xC0pL4sD8gA1eR6uI3oK9',
  PUBLIC_URL: 'https://brineline.example',
  SMTP_URL: 'smtps://mail.example:465',
  S3_ENDPOINT: 'https://s3.eu-west-1.amazonaws.com',
  S3_ACCESS_KEY_ID: 'AKIAEXAMPLEPRODUCTION',
  S3_SECRET_ACCESS_KEY: 'wJalrXUtnFEMI/K7MDENG/bPxRfiCYEXAMPLEKEY',
};

const refusal = (env: Record<string, string | undefined>) => {
  try {
    loadConfig(env);
    return '';
  } catch (err) {
    return (err as Error).message;
  }
};

describe('production configuration', () => {
  it('starts with real settings', () => {
    expect(refusal(productionEnv)).toBe('');
  });

  it('refuses a missing JWT key', () => {
    expect(refusal({ ...productionEnv, JWT_SECRET: undefined })).toMatch(/JWT_SECRET: required/);
  });

  it('refuses the published development key, which would let anyone sign a member in', () => {
    expect(refusal({ ...productionEnv, JWT_SECRET: DEVELOPMENT_JWT_SECRET })).toMatch(/JWT_SECRET: this is the published development key/);
    // The key a probe signed with: still in the repository's history, so it must stay refused.
    expect(refusal({ ...productionEnv, JWT_SECRET: 'brineline-development-secret-change-me-0123456789' })).toMatch(/JWT_SECRET/);
  });

  it('refuses a short or repetitive key', () => {
    expect(refusal({ ...productionEnv, JWT_SECRET: 'short-key' })).toMatch(/JWT_SECRET/);
    expect(refusal({ ...productionEnv, JWT_SECRET: 'ab'.repeat(32) })).toMatch(/JWT_SECRET: too weak/);
  });

  it('refuses the development stores, mail catcher and mailbox', () => {
    expect(refusal({ ...productionEnv, S3_ACCESS_KEY_ID: undefined, S3_SECRET_ACCESS_KEY: undefined })).toMatch(/S3_ACCESS_KEY_ID/);
    expect(refusal({ ...productionEnv, S3_ENDPOINT: undefined })).toMatch(/S3_ENDPOINT/);
    expect(refusal({ ...productionEnv, SMTP_URL: undefined })).toMatch(/SMTP_URL/);
    expect(refusal({ ...productionEnv, PUBLIC_URL: undefined })).toMatch(/PUBLIC_URL/);
    expect(refusal({ ...productionEnv, DEV_MAIL_DIR: '/tmp/mail' })).toMatch(/DEV_MAIL_DIR/);
    expect(refusal({ ...productionEnv, BCRYPT_COST: '10' })).toMatch(/BCRYPT_COST/);
  });

  it('names every problem at once', () => {
    const message = refusal({ NODE_ENV: 'production', DATABASE_URL: productionEnv.DATABASE_URL });
    for (const name of ['JWT_SECRET', 'PUBLIC_URL', 'S3_ENDPOINT', 'S3_ACCESS_KEY_ID', 'SMTP_URL']) expect(message).toContain(name);
  });

  it('keeps the development defaults outside production', () => {
    const dev = loadConfig({ DATABASE_URL: 'postgres://localhost/x' });
    expect(dev.JWT_SECRET).toBe(DEVELOPMENT_JWT_SECRET);
  });
});

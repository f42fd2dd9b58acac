import 'vitest';

declare module 'vitest' {
  export interface ProvidedContext {
    /** Environment for a test app: DATABASE_URL, SMTP_URL, S3_ENDPOINT and friends. */
    testEnv: Record<string, string>;
    /** Base URL of the full app started for browser tests. */
    baseUrl: string;
  }
}

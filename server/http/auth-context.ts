import type { Role } from '@shared/api/roles';

/** Who is calling, from a verified access token. */
export interface AuthContext {
  userId: string;
  orgId: string;
  role: Role;
  email: string;
  /**
   * The session (refresh-token family) the access token was issued in. Every verified token has one;
   * a request is refused once that session is ended (sign-out, password reset, deactivation).
   */
  sessionId?: string;
}

declare module 'express-serve-static-core' {
  interface Request {
    auth?: AuthContext;
    id: string | number | object;
  }
}

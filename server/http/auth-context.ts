import type { Role } from '@shared/api/roles';

/** Who is calling, from a verified access token. */
export interface AuthContext {
  userId: string;
  orgId: string;
  role: Role;
  email: string;
}

declare module 'express-serve-static-core' {
  interface Request {
    auth?: AuthContext;
    id: string | number | object;
  }
}

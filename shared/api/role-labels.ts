/** How roles read on screen. Apart from the schemas (no zod here), so the app header can show them cheaply. */
import type { Role } from './roles';

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Admin',
  engineer: 'Engineer',
  surveyor: 'Surveyor',
};

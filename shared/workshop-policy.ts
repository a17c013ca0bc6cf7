/**
 * Who may do what in a workshop: the one policy the server enforces and the app uses to hide
 * what a role may not do. The server never trusts the app's view of it.
 */
import type { Role } from './account-schemas.js';

export type WorkshopAction =
  'view' | 'rename' | 'see-member-emails' | 'manage-members' | 'manage-invitations' | 'write-builds' | 'export';

const ALLOWED: Readonly<Record<WorkshopAction, readonly Role[]>> = {
  view: ['owner', 'builder', 'viewer'],
  rename: ['owner'],
  'see-member-emails': ['owner'],
  'manage-members': ['owner'],
  'manage-invitations': ['owner'],
  'write-builds': ['owner', 'builder'],
  export: ['owner'],
};

export function may(role: Role | null | undefined, action: WorkshopAction): boolean {
  return role != null && ALLOWED[action].includes(role);
}

import type { Role } from '@benchtide/shared';

export const ROLE_LABELS: Readonly<Record<Role, string>> = {
  owner: 'Owner',
  builder: 'Builder',
  viewer: 'Viewer',
};

/** What each role may do, in the words the Workshop screen uses to explain it. */
export const ROLE_DUTIES: Readonly<Record<Role, string>> = {
  owner: 'Everything a builder does, and runs the workshop: its name, members and invitations',
  builder: 'Adds and changes builds, pours and stock',
  viewer: 'Sees the builds and pours, changes nothing',
};

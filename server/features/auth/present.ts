import type { IUser } from '../../db/entities.ts';

/** The public form of a user for `{ user }` replies. */
export const presentUser = (u: IUser) => ({ id: u.id, email: u.email, name: u.name, role: u.role });

/** The admin list form. */
export const presentUserAdmin = (u: IUser) => ({
  ...presentUser(u),
  active: u.active,
  invitePending: u.invitePending,
  createdAt: u.createdAt.toISOString(),
  lastSignInAt: u.lastSignInAt ? u.lastSignInAt.toISOString() : null,
});

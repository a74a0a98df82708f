/** Users, sessions and tokens as `/api/me`, `/api/users` and `/api/tokens` present them. */
import type { Role } from './roles.ts';

export interface PersonRef {
  id: number;
  name: string;
}

/** The signed-in user (`GET /api/me`, `POST /api/auth/login`). */
export interface SessionUser {
  id: number;
  email: string;
  name: string;
  role: Role;
}

export interface MeResponse {
  user: SessionUser;
  organisation?: { name: string } | null;
}

/** A user as the admin's list shows them (`GET /api/users`). */
export interface AdminUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  invitePending: boolean;
  createdAt: string;
  lastSignInAt: string | null;
}

export interface UsersResponse {
  items: AdminUser[];
  total: number;
}

/** A CI token (`GET /api/tokens`); the secret itself is in the create answer only. */
export interface ApiToken {
  id: number;
  project: string;
  name: string;
  prefix: string;
  createdBy: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

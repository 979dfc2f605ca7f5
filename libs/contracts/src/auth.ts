import { z } from 'zod';

/** The five roles of Keelson. */
export const ROLES = ['admin', 'buyer', 'risk_manager', 'plant_manager', 'viewer'] as const;
/** One of the five roles. */
export type Role = (typeof ROLES)[number];
/** Zod schema of a role. */
export const roleSchema = z.enum(ROLES);

/** Human labels for the roles, for screens and e-mails. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  buyer: 'Buyer',
  risk_manager: 'Risk manager',
  plant_manager: 'Plant manager',
  viewer: 'Viewer',
};

/** The header every state-changing request made with the session cookie must carry. */
export const CSRF_HEADER = 'x-keelson-csrf';
/** The value of {@link CSRF_HEADER}. */
export const CSRF_HEADER_VALUE = '1';
/** Name of the httpOnly session cookie. */
export const SESSION_COOKIE = 'keelson_session';

/** A user as the API shows it (never the password hash). */
export interface UserDto {
  id: number;
  email: string;
  name: string;
  role: Role;
  /** Plants a plant manager manages; empty for other roles. */
  plantCodes: string[];
  isActive: boolean;
  /** True while an invitation is open and no password has been set. */
  isInvitePending: boolean;
  lastLoginAt: string | null;
  createdAt: string;
}

/** POST /api/auth/login body. */
export const loginRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  password: z.string().min(1).max(200),
});
/** POST /api/auth/login body. */
export type LoginRequest = z.infer<typeof loginRequestSchema>;

/** POST /api/auth/login answer. */
export interface LoginResponse {
  user: UserDto;
  /** The same signed JWT as in the cookie, for scripts (Authorization: Bearer). */
  token: string;
}

/** POST /api/auth/set-password body (accepting an invitation). */
export const setPasswordRequestSchema = z.object({
  token: z.string().min(10).max(200),
  password: z.string().min(10, 'Use at least 10 characters.').max(200),
});
/** POST /api/auth/set-password body. */
export type SetPasswordRequest = z.infer<typeof setPasswordRequestSchema>;

/** GET /api/auth/invitations/:token answer. */
export interface InvitationDto {
  email: string;
  name: string;
  expiresAt: string;
}

/** POST /api/users/invitations body (admin). */
export const inviteUserRequestSchema = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  name: z.string().trim().min(1).max(120),
  role: roleSchema,
  plantCodes: z.array(z.string().trim().min(1).max(40)).max(100).default([]),
});
/** POST /api/users/invitations body. */
export type InviteUserRequest = z.infer<typeof inviteUserRequestSchema>;

/** PATCH /api/users/:id body (admin). */
export const updateUserRequestSchema = z
  .object({
    name: z.string().trim().min(1).max(120).optional(),
    role: roleSchema.optional(),
    plantCodes: z.array(z.string().trim().min(1).max(40)).max(100).optional(),
    isActive: z.boolean().optional(),
  })
  .refine((body) => Object.keys(body).length > 0, 'Give at least one field to change.');
/** PATCH /api/users/:id body. */
export type UpdateUserRequest = z.infer<typeof updateUserRequestSchema>;

/** A plant of the workspace (the organisation's sites, to which plant managers belong). */
export interface PlantDto {
  code: string;
  name: string;
  country: string;
}

/** A message caught by the local SMTP sink, as listed. */
export interface MailSummaryDto {
  id: number;
  from: string;
  to: string[];
  subject: string;
  receivedAt: string;
}

/** A message caught by the local SMTP sink, in full. */
export interface MailMessageDto extends MailSummaryDto {
  text: string | null;
  html: string | null;
}

/** A notification e-mail the SMTP server has not taken yet. */
export interface MailOutboxItemDto {
  id: number;
  /** The kind of message (`plan_submitted`, `digest`, `rescoring`, ...). */
  kind: string;
  to: string[];
  subject: string;
  /** `pending`: tried again at `nextAttemptAt`; `failed`: given up after its last try. */
  status: 'pending' | 'failed';
  attempts: number;
  nextAttemptAt: string;
  lastError: string | null;
  createdAt: string;
}

/** GET /api/admin/mail/outbox answer: counts and the oldest unsent messages (up to 100). */
export interface MailOutboxDto {
  pending: number;
  failed: number;
  items: MailOutboxItemDto[];
}

/** POST /api/admin/mail/outbox/send answer: how many of the unsent messages went out. */
export interface MailOutboxSentDto {
  sent: number;
  /** Still not taken by the server (tried again later). */
  unsent: number;
}

/** The error body of every failed API call. */
export interface ApiErrorBody {
  error: { code: string; message: string; details?: unknown };
}

/** A page of a list. */
export interface Page<T> {
  items: T[];
  total: number;
}

/** A plant manager as shown on a plant's page. */
export interface PlantManagerDto {
  id: number;
  name: string;
  email: string;
}

/** GET /api/plants/:code answer: the plant and who manages it. */
export interface PlantDetailDto extends PlantDto {
  managers: PlantManagerDto[];
}

/** The fields GET /api/users can sort by. */
export const USER_SORT_FIELDS = ['name', 'email', 'role', 'createdAt', 'lastLoginAt'] as const;
/** One of {@link USER_SORT_FIELDS}. */
export type UserSortField = (typeof USER_SORT_FIELDS)[number];

/** Paging of every list: `limit` (1-200, default 50) and `offset` (default 0). */
export const pageQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  offset: z.coerce.number().int().min(0).max(1_000_000).default(0),
});
/** Paging of every list. */
export type PageQuery = z.infer<typeof pageQuerySchema>;

/** GET /api/users query: search text (name or e-mail), role, sort, order and paging. */
export const listUsersQuerySchema = pageQuerySchema.extend({
  q: z.string().trim().max(120).optional(),
  role: roleSchema.optional(),
  sort: z.enum(USER_SORT_FIELDS).default('name'),
  order: z.enum(['asc', 'desc']).default('asc'),
});
/** GET /api/users query. */
export type ListUsersQuery = z.infer<typeof listUsersQuerySchema>;

/** The modes the server runs in. */
export const KEELSON_MODES = ['demo', 'production', 'test'] as const;
/** One of {@link KEELSON_MODES}. */
export type KeelsonMode = (typeof KEELSON_MODES)[number];

/** GET /api/health answer. */
export interface HealthDto {
  status: 'ok' | 'error';
  db: 'ok' | 'error';
  version: string;
  mode: KeelsonMode;
}

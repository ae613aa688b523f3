// Sign-in, invitation and people schemas shared by the client and the server.
import { z } from 'zod';
import { ROLES } from './project';

/** Characters that change nothing on screen: byte-order mark, zero-width space / joiners, word joiner, soft hyphen. */
const INVISIBLE = /[\uFEFF\u200B-\u200D\u2060\u00AD]/g;

/**
 * The one spelling of an e-mail address used for sign-in, rate limits and look-ups:
 * NFKC (full-width letters and ＠ fold to ASCII), invisible characters removed, trimmed,
 * lower case. Reference: Unicode UAX #15 (normalization forms).
 * @example normalizeEmail(' \uFEFFLena@Lab.Example\t') // 'lena@lab.example'
 */
export function normalizeEmail(raw: string): string {
  return raw.normalize('NFKC').replace(INVISIBLE, '').trim().toLowerCase();
}

const emailField = z.string().max(320).transform(normalizeEmail).pipe(z.string().email('an e-mail address like name@lab.example'));

export const loginSchema = z.object({
  email: emailField,
  password: z.string().min(1, 'required').max(200),
});

export const passwordRule = z.string().min(10, 'at least 10 characters').max(200);

export const inviteCreateSchema = z.object({
  email: emailField,
  role: z.enum(ROLES),
  labId: z.number().int().positive().nullish(),
});

export const inviteAcceptSchema = z.object({
  name: z.string().trim().min(2, 'at least 2 characters').max(100),
  password: passwordRule,
});

export const personUpdateSchema = z
  .object({
    name: z.string().trim().min(2).max(100).optional(),
    isAdmin: z.boolean().optional(),
    labId: z.number().int().positive().nullable().optional(),
    disabled: z.boolean().optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), { message: 'nothing to change: send at least one of name, isAdmin, labId, disabled' });

export const membershipSetSchema = z.object({
  userId: z.number().int().positive(),
  role: z.enum(ROLES),
});

export type InviteCreate = z.input<typeof inviteCreateSchema>;
export type PersonUpdate = z.input<typeof personUpdateSchema>;
export type MembershipSet = z.input<typeof membershipSetSchema>;

export const labCreateSchema = z.object({
  name: z.string().trim().min(2).max(100),
  kind: z.enum(['home', 'partner']),
  city: z.string().trim().max(100).nullish(),
});

export type LabCreate = z.input<typeof labCreateSchema>;

/** What a personal API token may do: read only; read and upload curves; or all the person may do (except minting tokens and ending browser sessions). */
export const TOKEN_SCOPES = ['read', 'upload', 'full'] as const;
export type TokenScope = (typeof TOKEN_SCOPES)[number];

export const apiTokenCreateSchema = z.object({
  name: z.string().trim().min(1).max(60),
  /** omitted by older scripts: full, as tokens were before scopes */
  scope: z.enum(TOKEN_SCOPES).default('full'),
});
export type ApiTokenCreate = z.input<typeof apiTokenCreateSchema>;

/** Paging and filters of the admin lists (outbox, audit log): newest first, `before` an id. */
export const adminPageQuery = z.object({
  before: z.coerce.number().int().positive().optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  projectId: z.coerce.number().int().positive().optional(),
  entity: z.string().max(40).optional(),
  entityId: z.coerce.number().int().positive().optional(),
});
export type AdminPageQuery = z.infer<typeof adminPageQuery>;

/**
 * The risk register: one entry per supplier risk, its score (impact band x likelihood, with
 * overrides kept with who, when and why), owner, status and notes; and the scoring settings.
 */
import { z } from 'zod';
import type { RatingBand } from './runs';

/** Where an entry stands. */
export const REGISTER_STATUSES = ['open', 'mitigating', 'accepted', 'closed'] as const;
/** One of {@link REGISTER_STATUSES}. */
export type RegisterStatus = (typeof REGISTER_STATUSES)[number];

/**
 * What a quarterly re-scoring noticed about an entry: its supplier is no longer in the network,
 * or it no longer matters (not a single point of failure, rated low). People decide.
 */
export const REGISTER_FLAGS = ['supplier_removed', 'no_longer_matters'] as const;
/** One of {@link REGISTER_FLAGS}. */
export type RegisterFlag = (typeof REGISTER_FLAGS)[number];

/** One override of an entry's likelihood. */
export interface LikelihoodOverrideDto {
  id: number;
  /** The new likelihood, or null when the override was removed. */
  likelihood: number | null;
  previous: number | null;
  reason: string;
  user: { id: number; name: string } | null;
  createdAt: string;
}

/** A register entry as listed. */
export interface RegisterEntryDto {
  id: number;
  title: string;
  supplierCode: string;
  supplierName: string | null;
  plants: string[];
  origin: 'automatic' | 'manual';
  status: RegisterStatus;
  owner: { id: number; name: string } | null;
  runId: number | null;
  computedLikelihood: number;
  likelihoodOverride: number | null;
  /** override ?? computed. */
  likelihood: number;
  impactBand: number;
  rating: number;
  ratingBand: RatingBand;
  notes: string;
  /** Set by the last quarterly re-scoring; null when it noticed nothing. */
  flag: RegisterFlag | null;
  createdAt: string;
  updatedAt: string;
}

/** GET /api/register/:id answer. */
export interface RegisterEntryDetailDto extends RegisterEntryDto {
  overrides: LikelihoodOverrideDto[];
}

/** Sort fields of the register table. */
export const REGISTER_SORT_FIELDS = [
  'id', 'title', 'supplierCode', 'status', 'likelihood', 'impactBand', 'rating', 'updatedAt',
] as const;
/** One of {@link REGISTER_SORT_FIELDS}. */
export type RegisterSortField = (typeof REGISTER_SORT_FIELDS)[number];

/** GET /api/register query. */
export const listRegisterQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(1000).default(50),
  offset: z.coerce.number().int().min(0).max(10_000_000).default(0),
  sort: z.enum(REGISTER_SORT_FIELDS).default('rating'),
  order: z.enum(['asc', 'desc']).default('desc'),
  q: z.string().trim().max(120).optional(),
  status: z.enum(REGISTER_STATUSES).optional(),
  ratingBand: z.enum(['low', 'medium', 'high', 'critical']).optional(),
  plant: z.string().trim().max(40).optional(),
  ownerId: z.coerce.number().int().positive().optional(),
  /** Entries a re-scoring flagged: one flag, or `flagged` for either. */
  flag: z.enum([...REGISTER_FLAGS, 'flagged']).optional(),
});
/** GET /api/register query. */
export type ListRegisterQuery = z.infer<typeof listRegisterQuerySchema>;

/** POST /api/register body (an entry made by hand). */
export const createRegisterEntrySchema = z.object({
  supplierCode: z.string().trim().min(1).max(60),
  title: z.string().trim().min(1).max(200),
  ownerId: z.number().int().positive().nullable().optional(),
  notes: z.string().max(10_000).optional(),
});
/** POST /api/register body. */
export type CreateRegisterEntryInput = z.infer<typeof createRegisterEntrySchema>;

/** PATCH /api/register/:id body. */
export const updateRegisterEntrySchema = z.object({
  title: z.string().trim().min(1).max(200).optional(),
  ownerId: z.number().int().positive().nullable().optional(),
  status: z.enum(REGISTER_STATUSES).optional(),
  notes: z.string().max(10_000).optional(),
});
/** PATCH /api/register/:id body. */
export type UpdateRegisterEntryInput = z.infer<typeof updateRegisterEntrySchema>;

/** POST /api/register/:id/likelihood body: override (1-5) or remove (null) with a reason. */
export const overrideLikelihoodSchema = z.object({
  likelihood: z.number().int().min(1).max(5).nullable(),
  reason: z.string().trim().min(5, 'say why, in at least 5 characters').max(2000),
});
/** POST /api/register/:id/likelihood body. */
export type OverrideLikelihoodInput = z.infer<typeof overrideLikelihoodSchema>;

/** GET /api/register answer: one page of entries and how many match the filters. */
export interface RegisterListDto {
  items: RegisterEntryDto[];
  total: number;
}

/** GET /api/register/export.xlsx query: the list's filters and sort, every matching entry. */
export const exportRegisterQuerySchema = listRegisterQuerySchema.omit({
  limit: true,
  offset: true,
});
/** GET /api/register/export.xlsx query. */
export type ExportRegisterQuery = z.infer<typeof exportRegisterQuerySchema>;

/** Name of the export's sheet that explains the scores. */
export const REGISTER_ABOUT_SHEET = 'About these numbers';

/** GET /api/register/owners answer: the active users an entry can be given to, by name. */
export interface RegisterOwnersDto {
  items: { id: number; name: string; role: string }[];
}

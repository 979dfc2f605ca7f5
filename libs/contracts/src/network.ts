/**
 * Browsing a network version: suppliers, products, items and the bill of materials, with
 * server-side paging, plus the country hazard table. A plant manager sees only what belongs
 * to (or supplies) their own plants.
 */
import { z } from 'zod';

/** A supplier of a network version, as listed. */
export interface NetworkSupplierDto {
  code: string;
  name: string;
  country: string;
  region: string;
  /** 1 sells to a plant; k + 1 sells to a tier-k supplier; null when it serves no plant. */
  tier: number | null;
  recoveryWeeks: number;
  financialHealth: number | null;
  deliveryScore: number | null;
  hasContinuityPlan: boolean | null;
  /** Plants it supplies, directly or through other suppliers (code order). */
  plants: string[];
  /** Sourcing rows in which it sells. */
  sellsCount: number;
  /** Sourcing rows in which it buys. */
  buysCount: number;
  /** The spreadsheet row it came from. */
  row: number | null;
}

/** Sort fields of the suppliers table (every listed column but the plants). */
export const SUPPLIER_SORT_FIELDS = [
  'code', 'name', 'country', 'region', 'tier', 'recoveryWeeks', 'financialHealth',
  'deliveryScore', 'hasContinuityPlan', 'sellsCount', 'buysCount',
] as const;
/** One of {@link SUPPLIER_SORT_FIELDS}. */
export type SupplierSortField = (typeof SUPPLIER_SORT_FIELDS)[number];

const pageFields = {
  limit: z.coerce.number().int().min(1).max(1000).default(50),
  offset: z.coerce.number().int().min(0).max(10_000_000).default(0),
  order: z.enum(['asc', 'desc']).default('asc'),
};

/** GET /api/network-versions/:id/suppliers query. */
export const listSuppliersQuerySchema = z.object({
  ...pageFields,
  /** Text in the code or name (case-insensitive). */
  q: z.string().trim().max(120).optional(),
  tier: z.coerce.number().int().min(1).max(50).optional(),
  country: z.string().trim().max(10).optional(),
  region: z.string().trim().max(60).optional(),
  /** Suppliers that serve this plant, directly or not. */
  plant: z.string().trim().max(40).optional(),
  sort: z.enum(SUPPLIER_SORT_FIELDS).default('code'),
});
/** GET /api/network-versions/:id/suppliers query. */
export type ListSuppliersQuery = z.infer<typeof listSuppliersQuerySchema>;

/** A sourcing row seen from one of its ends. */
export interface SourcingLinkDto {
  buyerCode: string;
  buyerKind: 'plant' | 'supplier';
  buyerName: string;
  itemCode: string;
  supplierCode: string;
  supplierName: string;
  sharePct: number | null;
  isQualified: boolean;
  /** Qualified sources of this (item, buyer), this one included. */
  qualifiedSources: number;
  row: number | null;
}

/** GET /api/network-versions/:id/suppliers/:code answer. */
export interface SupplierDetailDto extends NetworkSupplierDto {
  networkVersionId: number;
  /** What it sells, and to whom. */
  sells: SourcingLinkDto[];
  /** What it buys, and from whom. */
  buys: SourcingLinkDto[];
  /** Extra columns of its spreadsheet row. */
  attributes: Record<string, string>;
  /** The import it came from. */
  importBatch: { id: number; fileName: string; createdAt: string; createdBy: string | null };
}

/** A finished product of a network version. */
export interface NetworkProductDto {
  code: string;
  name: string;
  plantCode: string;
  weeklyRevenue: number;
  /** Direct BOM children. */
  componentCount: number;
  row: number | null;
}

/** Sort fields of the products table. */
export const PRODUCT_SORT_FIELDS = [
  'code', 'name', 'plantCode', 'weeklyRevenue', 'componentCount',
] as const;
/** One of {@link PRODUCT_SORT_FIELDS}. */
export type ProductSortField = (typeof PRODUCT_SORT_FIELDS)[number];

/** GET /api/network-versions/:id/products query. */
export const listProductsQuerySchema = z.object({
  ...pageFields,
  q: z.string().trim().max(120).optional(),
  plant: z.string().trim().max(40).optional(),
  sort: z.enum(PRODUCT_SORT_FIELDS).default('code'),
});
/** GET /api/network-versions/:id/products query. */
export type ListProductsQuery = z.infer<typeof listProductsQuerySchema>;

/** An item (part or assembly) at a plant or at a supplier that buys it. */
export interface NetworkItemDto {
  code: string;
  /** The plant or supplier that makes or buys it. */
  holderCode: string;
  holderKind: 'plant' | 'supplier';
  /** Made from BOM children at a plant, or bought. */
  kind: 'made' | 'bought';
  /** Qualified sources (bought items). */
  qualifiedSources: number;
  /** Parents in the BOM at that plant (made and bought items at plants). */
  usedIn: number;
  /** Weeks of cover from Stock (bought items at plants), or null. */
  weeksOfCover: number | null;
}

/** Sort fields of the items table. */
export const ITEM_SORT_FIELDS = [
  'code', 'holderCode', 'kind', 'qualifiedSources', 'weeksOfCover', 'holderKind', 'usedIn',
] as const;
/** One of {@link ITEM_SORT_FIELDS}. */
export type ItemSortField = (typeof ITEM_SORT_FIELDS)[number];

/** GET /api/network-versions/:id/items query. */
export const listItemsQuerySchema = z.object({
  ...pageFields,
  q: z.string().trim().max(120).optional(),
  plant: z.string().trim().max(40).optional(),
  kind: z.enum(['made', 'bought']).optional(),
  /** Only bought items with at most one qualified source. */
  singleSourced: z.enum(['true', 'false']).optional(),
  sort: z.enum(ITEM_SORT_FIELDS).default('code'),
});
/** GET /api/network-versions/:id/items query. */
export type ListItemsQuery = z.infer<typeof listItemsQuerySchema>;

/** One level of the bill of materials below a product or made item, at a plant. */
export interface BomNodeDto {
  code: string;
  kind: 'product' | 'made' | 'bought';
  plantCode: string;
  name: string | null;
  children: {
    code: string;
    qtyPer: number;
    kind: 'made' | 'bought';
    /** Qualified sources of a bought child; null for made ones. */
    qualifiedSources: number | null;
    weeksOfCover: number | null;
    hasChildren: boolean;
  }[];
  /** Sourcing rows of a bought item at the plant. */
  sources: SourcingLinkDto[];
}

/** A country and its hazard rating (1 low - 5 high), edited by admins. */
export interface CountryDto {
  code: string;
  name: string;
  region: string;
  hazard: number;
  /** True while the rating is the shipped, invented default nobody has reviewed. */
  isDefault: boolean;
  updatedAt: string;
  updatedBy: string | null;
}

/** PUT /api/countries/:code body. */
export const updateCountrySchema = z.object({
  hazard: z.number().int().min(1).max(5),
  name: z.string().trim().min(1).max(80).optional(),
  region: z.string().trim().min(1).max(60).optional(),
});
/** PUT /api/countries/:code body. */
export type UpdateCountryInput = z.infer<typeof updateCountrySchema>;

/** GET /api/network-versions query: a page of versions, newest first. */
export const listNetworkVersionsQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(20),
  offset: z.coerce.number().int().min(0).max(10_000_000).default(0),
});
/** GET /api/network-versions query. */
export type ListNetworkVersionsQuery = z.infer<typeof listNetworkVersionsQuerySchema>;

/** GET /api/network-versions/:id/bom/:code query. */
export const bomQuerySchema = z.object({
  /** The plant whose bill of materials to open; a product's own plant when left out. */
  plant: z.string().trim().min(1).max(40).optional(),
});
/** GET /api/network-versions/:id/bom/:code query. */
export type BomQuery = z.infer<typeof bomQuerySchema>;

/** An ISO 3166-1 alpha-2 code as a route parameter (upper-cased). */
export const countryCodeSchema = z
  .string()
  .trim()
  .regex(/^[A-Za-z]{2}$/, 'Expected a two-letter ISO 3166-1 country code.')
  .transform((code) => code.toUpperCase());

/** 403 error code when a plant manager names a plant outside their own. */
export const PLANT_FORBIDDEN = 'plant_forbidden';

/**
 * The network picture: GET /api/network-versions/:id/picture, its query and answer (nodes and
 * edges of a version laid out in tiers, or grouped by tier and country above a size).
 */
import { z } from 'zod';

/** Nodes above which the picture is answered grouped by tier and country. */
export const AGGREGATE_ABOVE_NODES = 3000;

/** GET /api/network-versions/:id/picture query. */
export const networkPictureQuerySchema = z.object({
  /** A succeeded run of the same version whose single points of failure to mark. */
  runId: z.coerce.number().int().positive().optional(),
  /** `auto` (default): grouped above {@link AGGREGATE_ABOVE_NODES} nodes; `aggregated`: always. */
  mode: z.enum(['auto', 'aggregated']).default('auto'),
});
/** GET /api/network-versions/:id/picture query. */
export type NetworkPictureQuery = z.infer<typeof networkPictureQuerySchema>;

/** Kinds of node in a picture: the graph's four, plus a group of suppliers when aggregated. */
export type NetworkPictureNodeKind = 'plant' | 'product' | 'item' | 'supplier' | 'supplierGroup';

/** One node of the picture. */
export interface NetworkPictureNodeDto {
  /** The supply graph's node id (`supplier:S1`), or `group:<tier|none>:<country>`. */
  id: string;
  kind: NetworkPictureNodeKind;
  /** Plant, product, item or supplier code; the country of a supplier group. */
  code: string;
  /** What people read: the name, `item at buyer`, or `Tier 2 · CN`. */
  label: string;
  /** Supplier tier (of a group too); null elsewhere and for suppliers no plant depends on. */
  tier: number | null;
  /** Layer for drawing: 0 for plants, growing leftwards against the flow of material. */
  column: number;
  /** A supplier the chosen run found to be a single point of failure (false without a run). */
  isSinglePoint: boolean;
  /** The supplier's revenue impact in the run (a group's sum); null without a run. */
  revenueImpact: number | null;
  /** Suppliers in a group (aggregated form only). */
  count?: number;
  /** Single points of failure in a group (aggregated form only). */
  singlePoints?: number;
}

/** A directed edge, in the direction material flows. */
export interface NetworkPictureEdgeDto {
  source: string;
  target: string;
  /** Supplier-to-buyer links behind an edge between groups (aggregated form only). */
  count?: number;
}

/** GET /api/network-versions/:id/picture answer. */
export interface NetworkPictureDto {
  networkVersionId: number;
  runId: number | null;
  /** `full`: every node; `aggregated`: suppliers grouped by (tier, country), items left out. */
  mode: 'full' | 'aggregated';
  /** Nodes and edges of the network the user may see, before any grouping. */
  totalNodes: number;
  totalEdges: number;
  /** Single points of failure among the suppliers shown (0 without a run). */
  singlePoints: number;
  nodes: NetworkPictureNodeDto[];
  edges: NetworkPictureEdgeDto[];
}

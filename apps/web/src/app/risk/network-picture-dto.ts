/**
 * The answer of GET /api/network-versions/:id/picture, as the client reads it. Mirrors
 * `apps/api/src/network-picture/network-picture-dto.ts` (the API's own file); both belong in
 * `@keelson/contracts` once that can be changed.
 */

/** Kinds of node in a picture: the graph's four, plus a group of suppliers when aggregated. */
export type NetworkPictureNodeKind = 'plant' | 'product' | 'item' | 'supplier' | 'supplierGroup';

/** One node of the picture. */
export interface NetworkPictureNode {
  id: string;
  kind: NetworkPictureNodeKind;
  /** Plant, product, item or supplier code; the country of a supplier group. */
  code: string;
  label: string;
  tier: number | null;
  /** Layer: 0 for plants, growing leftwards against the flow of material. */
  column: number;
  isSinglePoint: boolean;
  revenueImpact: number | null;
  /** Suppliers in a group (aggregated form only). */
  count?: number;
  /** Single points of failure in a group (aggregated form only). */
  singlePoints?: number;
}

/** A directed edge, in the direction material flows. */
export interface NetworkPictureEdge {
  source: string;
  target: string;
  /** Links behind an edge between groups (aggregated form only). */
  count?: number;
}

/** GET /api/network-versions/:id/picture answer. */
export interface NetworkPicture {
  networkVersionId: number;
  runId: number | null;
  mode: 'full' | 'aggregated';
  totalNodes: number;
  totalEdges: number;
  singlePoints: number;
  nodes: NetworkPictureNode[];
  edges: NetworkPictureEdge[];
}

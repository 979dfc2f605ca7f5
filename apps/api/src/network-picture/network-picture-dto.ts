/** The picture's contract lives in `@keelson/contracts` (network-picture.ts). */
export {
  AGGREGATE_ABOVE_NODES,
  networkPictureQuerySchema,
  type NetworkPictureQuery,
  type NetworkPictureNodeKind,
  type NetworkPictureNodeDto,
  type NetworkPictureEdgeDto,
  type NetworkPictureDto,
} from '@keelson/contracts';

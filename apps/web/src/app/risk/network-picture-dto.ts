/** The picture's contract, from `@keelson/contracts` (network-picture.ts), by its web names. */
export type {
  NetworkPictureDto as NetworkPicture,
  NetworkPictureEdgeDto as NetworkPictureEdge,
  NetworkPictureNodeDto as NetworkPictureNode,
  NetworkPictureNodeKind,
} from '@keelson/contracts';

import type { NetworkPictureNode } from './network-picture-dto';

/**
 * Nodes whose code or label contains `text` (case-insensitive), best first: an exact code,
 * then codes and labels starting with the text, then the rest; suppliers before other kinds
 * at equal rank, then code order.
 */
export function findPictureNodes(
  nodes: readonly NetworkPictureNode[],
  text: string,
): NetworkPictureNode[] {
  const needle = text.trim().toLowerCase();
  if (needle === '') return [];
  const rank = (node: NetworkPictureNode): number => {
    const code = node.code.toLowerCase();
    const label = node.label.toLowerCase();
    if (code === needle) return 0;
    if (code.startsWith(needle) || label.startsWith(needle)) return 1;
    if (code.includes(needle) || label.includes(needle)) return 2;
    return -1;
  };
  return nodes
    .map((node) => ({ node, rank: rank(node) }))
    .filter((entry) => entry.rank >= 0)
    .sort((a, b) =>
      a.rank - b.rank ||
      Number(b.node.kind === 'supplier') - Number(a.node.kind === 'supplier') ||
      a.node.code.localeCompare(b.node.code),
    )
    .map((entry) => entry.node);
}

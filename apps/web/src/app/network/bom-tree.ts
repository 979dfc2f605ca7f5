import type { BomNodeDto, SourcingLinkDto } from '@keelson/contracts';

/** A BOM child as the API lists it under its parent. */
export type BomChild = BomNodeDto['children'][number];

/** What is known about one expanded node of the tree. */
export type BomNodeState =
  | { readonly status: 'loading' }
  | { readonly status: 'loaded'; readonly node: BomNodeDto }
  | { readonly status: 'error'; readonly message: string };

/** One visible line of the drill-down, in display order. */
export type BomRow =
  | {
      readonly type: 'child';
      /** The codes from the product down to this child, joined by "/": unique per line. */
      readonly key: string;
      readonly depth: number;
      readonly child: BomChild;
      /** Made children with components, and every bought child (its suppliers). */
      readonly isExpandable: boolean;
      readonly isExpanded: boolean;
    }
  | { readonly type: 'source'; readonly key: string; readonly depth: number;
      readonly source: SourcingLinkDto }
  | { readonly type: 'loading'; readonly key: string; readonly depth: number }
  | { readonly type: 'error'; readonly key: string; readonly depth: number;
      readonly message: string }
  | { readonly type: 'empty'; readonly key: string; readonly depth: number;
      readonly message: string };

/** True when a child can be opened: a made child with components, or a bought one. */
export function isExpandable(child: BomChild): boolean {
  return child.kind === 'bought' || child.hasChildren;
}

/**
 * Flattens the loaded part of a bill of materials into visible lines: the root's children, and
 * below each expanded one its own children (made) or its suppliers (bought), or a loading,
 * error or empty line while that level is not there. Pure, so the page can recompute it from
 * its signals.
 */
export function bomRows(
  root: BomNodeDto,
  expanded: ReadonlySet<string>,
  nodes: ReadonlyMap<string, BomNodeState>,
): BomRow[] {
  const rows: BomRow[] = [];
  const visit = (parentKey: string, children: readonly BomChild[], depth: number): void => {
    for (const child of children) {
      const key = `${parentKey}/${child.code}`;
      const canOpen = isExpandable(child);
      const isOpen = canOpen && expanded.has(key);
      rows.push({ type: 'child', key, depth, child, isExpandable: canOpen, isExpanded: isOpen });
      if (isOpen) {
        below(key, child, depth + 1);
      }
    }
  };
  const below = (key: string, child: BomChild, depth: number): void => {
    const state = nodes.get(key) ?? { status: 'loading' };
    if (state.status === 'loading') {
      rows.push({ type: 'loading', key: `${key}#loading`, depth });
    } else if (state.status === 'error') {
      rows.push({ type: 'error', key: `${key}#error`, depth, message: state.message });
    } else if (child.kind === 'made') {
      visit(key, state.node.children, depth);
    } else if (state.node.sources.length === 0) {
      const message = 'No sourcing row names a supplier for it at this plant.';
      rows.push({ type: 'empty', key: `${key}#empty`, depth, message });
    } else {
      state.node.sources.forEach((source, index) =>
        rows.push({ type: 'source', key: `${key}#${index}`, depth, source }),
      );
    }
  };
  visit(root.code, root.children, 1);
  return rows;
}

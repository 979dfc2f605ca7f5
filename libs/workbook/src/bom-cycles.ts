/**
 * BOM cycles (spec 8.10): every BOM row whose parent and child lie in one cycle is an error at
 * its child_code, and the message names a cycle through that row. Cycles are found as the
 * strongly connected components of the parent -> child graph (Tarjan, "Depth-first search and
 * linear graph algorithms", SIAM J. Computing 1(2), 1972, doi:10.1137/0201010), run without
 * recursion so a deep BOM cannot overflow the stack; O(V + E). The cycle named for a row is the
 * shortest one through it (a breadth-first search inside its component), written from its
 * smallest code so all rows of one loop show the same text.
 */
import type { BomLine, WorkbookError } from '@keelson/contracts';
import type { MakeError } from './problem-locator';

/** Searches past this much work per component name the component instead of a shortest cycle. */
const SEARCH_BUDGET = 5_000_000;
const LISTED_CODES = 12;

/** Errors for every BOM row that lies on a cycle. */
export function checkBomCycles(bom: readonly BomLine[], makeError: MakeError): WorkbookError[] {
  const children = new Map<string, string[]>();
  for (const line of bom) {
    const list = children.get(line.parentCode) ?? [];
    list.push(line.childCode);
    children.set(line.parentCode, list);
  }
  const component = stronglyConnected(children);
  const sizes = new Map<number, number>();
  for (const id of component.values()) {
    sizes.set(id, (sizes.get(id) ?? 0) + 1);
  }
  const cyclic = bom.filter((line) => {
    const id = component.get(line.parentCode);
    return id !== undefined && id === component.get(line.childCode) &&
      ((sizes.get(id) ?? 0) > 1 || line.parentCode === line.childCode);
  });
  const linesPerComponent = new Map<number, number>();
  for (const line of cyclic) {
    const id = component.get(line.parentCode) as number;
    linesPerComponent.set(id, (linesPerComponent.get(id) ?? 0) + 1);
  }
  const members = new Map<number, string[]>();
  return cyclic.map((line) => {
    const id = component.get(line.parentCode) as number;
    const lines = linesPerComponent.get(id) ?? 0;
    const cycle = lines * lines <= SEARCH_BUDGET
      ? shortestCycle(line, children, (code) => component.get(code) === id)
      : null;
    const message = cycle === null
      ? componentMessage(line, membersOf(id, component, members))
      : `BOM cycle: ${rotate(cycle).join(' -> ')}`;
    return makeError('BOM', line.row, 'child_code', line.childCode, message);
  });
}

/** Component id of every code, by Tarjan's algorithm with an explicit stack. */
function stronglyConnected(children: ReadonlyMap<string, string[]>): Map<string, number> {
  const index = new Map<string, number>();
  const low = new Map<string, number>();
  const onStack = new Set<string>();
  const stack: string[] = [];
  const component = new Map<string, number>();
  let counter = 0;
  let components = 0;
  for (const root of children.keys()) {
    if (index.has(root)) {
      continue;
    }
    const work: { node: string; next: number }[] = [{ node: root, next: 0 }];
    index.set(root, counter);
    low.set(root, counter);
    counter += 1;
    stack.push(root);
    onStack.add(root);
    while (work.length > 0) {
      const frame = work[work.length - 1] as { node: string; next: number };
      const list = children.get(frame.node) ?? [];
      if (frame.next < list.length) {
        const child = list[frame.next] as string;
        frame.next += 1;
        if (!index.has(child)) {
          index.set(child, counter);
          low.set(child, counter);
          counter += 1;
          stack.push(child);
          onStack.add(child);
          work.push({ node: child, next: 0 });
        } else if (onStack.has(child)) {
          low.set(frame.node, Math.min(low.get(frame.node) as number, index.get(child) as number));
        }
        continue;
      }
      work.pop();
      const parent = work[work.length - 1];
      if (parent !== undefined) {
        const lowest = Math.min(low.get(parent.node) as number, low.get(frame.node) as number);
        low.set(parent.node, lowest);
      }
      if (low.get(frame.node) === index.get(frame.node)) {
        let member: string | undefined;
        do {
          member = stack.pop() as string;
          onStack.delete(member);
          component.set(member, components);
        } while (member !== frame.node);
        components += 1;
      }
    }
  }
  return component;
}

/** parent -> child -> ... -> parent, the shortest walk back from child inside the component. */
function shortestCycle(
  line: BomLine,
  children: ReadonlyMap<string, string[]>,
  isInside: (code: string) => boolean,
): string[] | null {
  if (line.parentCode === line.childCode) {
    return [line.parentCode, line.parentCode];
  }
  const previous = new Map<string, string>([[line.childCode, '']]);
  const queue = [line.childCode];
  for (let head = 0; head < queue.length; head += 1) {
    const node = queue[head] as string;
    for (const next of children.get(node) ?? []) {
      if (previous.has(next) || !isInside(next)) {
        continue;
      }
      previous.set(next, node);
      if (next === line.parentCode) {
        const path = [next];
        for (let at = node; at !== ''; at = previous.get(at) as string) {
          path.push(at);
        }
        path.push(line.parentCode);
        return path.reverse();
      }
      queue.push(next);
    }
  }
  return null;
}

/** The cycle started from its smallest code (code-point order), closed again at the end. */
function rotate(cycle: readonly string[]): string[] {
  const open = cycle.slice(0, -1);
  let start = 0;
  open.forEach((code, at) => {
    if (code < (open[start] as string)) {
      start = at;
    }
  });
  const turned = [...open.slice(start), ...open.slice(0, start)];
  return [...turned, turned[0] as string];
}

function membersOf(
  id: number,
  component: ReadonlyMap<string, number>,
  cache: Map<number, string[]>,
): string[] {
  let members = cache.get(id);
  if (members === undefined) {
    members = [...component].filter(([, of]) => of === id).map(([code]) => code).sort();
    cache.set(id, members);
  }
  return members;
}

function componentMessage(line: BomLine, members: readonly string[]): string {
  const listed = members.slice(0, LISTED_CODES).join(', ');
  const more = members.length > LISTED_CODES ? `, and ${members.length - LISTED_CODES} more` : '';
  return `BOM cycle: ${line.parentCode} -> ${line.childCode} lies on a loop among ` +
    `${members.length} codes (${listed}${more})`;
}

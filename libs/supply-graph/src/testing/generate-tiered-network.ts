/**
 * A seeded generator of tiered supply networks that pass the import's validation: plants make
 * products from a levelled bill of materials (so no BOM cycles); tier-1 suppliers sell the leaf
 * parts to plants; each tier-k supplier buys components from tier k + 1; the deepest tier buys
 * nothing. Some bought items are dual-sourced, some rows unqualified, some plant parts unsourced,
 * and some supplier pairs sell to each other (supplier cycles). Used by the benchmark, the
 * property tests and the demo generator.
 */
import type {
  BomLine,
  Plant,
  Product,
  SourcingRow,
  StockRow,
  Supplier,
  SupplyModel,
} from '@keelson/contracts';
import { mulberry32, pick, randomInt, shuffled, type Random } from './mulberry32';

/** Options of {@link generateTieredNetwork}. */
export interface TieredNetworkOptions {
  /** Seed of the generator: the same options give the same model. */
  seed: number;
  /** Number of suppliers (at least 1). */
  suppliers: number;
  /** Plants; default max(1, round(suppliers / 1000)). */
  plants?: number;
  /** Products; default round(suppliers / 100) clamped to 4..500. */
  products?: number;
  /** Supplier tiers; default 4 (fewer when there are fewer suppliers). */
  tiers?: number;
  /** Made items per product at each BOM level below the product; default [2]. */
  itemsPerLevel?: readonly number[];
  /** Target directed edges of the graph per supplier; default 20. */
  edgesPerSupplier?: number;
  /** Share of bought (item, buyer) pairs with a second qualified source; default 0.3. */
  dualSourcedShare?: number;
  /** Share of bought (item, buyer) pairs with an extra unqualified row; default 0.05. */
  unqualifiedShare?: number;
  /** Share of plant parts with no Sourcing row at all (unsourced); default 0. */
  unsourcedShare?: number;
  /** Share of plant parts with a Stock row; default 0.6. */
  stockShare?: number;
  /** Supplier cycles to add (a tier-k+1 supplier buying from its tier-k customer); default 0. */
  cycles?: number;
}

const COUNTRIES = [
  ['DE', 'Europe'], ['PL', 'Europe'], ['CZ', 'Europe'], ['IT', 'Europe'], ['CN', 'Asia'],
  ['TW', 'Asia'], ['JP', 'Asia'], ['IN', 'Asia'], ['US', 'Americas'], ['MX', 'Americas'],
  ['BR', 'Americas'], ['TR', 'Europe'],
] as const;

const pad = (value: number, width: number) => String(value).padStart(width, '0');

/** A valid supply model with the requested shape; deterministic for a given seed. */
export function generateTieredNetwork(options: TieredNetworkOptions): SupplyModel {
  const random = mulberry32(options.seed);
  const supplierCount = Math.max(1, Math.floor(options.suppliers));
  const plantCount = Math.max(1, options.plants ?? Math.round(supplierCount / 1000));
  const defaultProducts = clamp(Math.round(supplierCount / 100), 4, 500);
  const productCount = Math.max(1, options.products ?? defaultProducts);
  const tierCount = Math.max(1, Math.min(options.tiers ?? 4, supplierCount));
  const dual = options.dualSourcedShare ?? 0.3;
  const unqualified = options.unqualifiedShare ?? 0.05;
  const unsourced = options.unsourcedShare ?? 0;
  const stockShare = options.stockShare ?? 0.6;
  const edgeTarget = (options.edgesPerSupplier ?? 20) * supplierCount;

  const plants: Plant[] = Array.from({ length: plantCount }, (_, i) => {
    const [country] = pick(random, COUNTRIES);
    return { code: `PL-${pad(i + 1, 3)}`, name: `Plant ${i + 1}`, country, row: i + 2 };
  });
  const products: Product[] = Array.from({ length: productCount }, (_, i) => ({
    code: `PR-${pad(i + 1, 5)}`,
    plantCode: plants[i % plantCount]!.code,
    name: `Product ${i + 1}`,
    weeklyRevenue: randomInt(random, 5, 100) * 1000,
    row: i + 2,
  }));
  const suppliers = makeSuppliers(random, supplierCount);
  const tiers = splitTiers(suppliers, tierCount);
  const tierOne = tiers[0]!;

  // Bill of materials: products -> made items per level -> leaf parts, one plant each product.
  const bom: BomLine[] = [];
  const partsAtPlant = new Map<string, Set<string>>(plants.map((p) => [p.code, new Set()]));
  const partsPerProduct = Math.max(2, Math.ceil((tierOne.length * 1.1) / productCount));
  const levels = options.itemsPerLevel ?? [2];
  let partNumber = 0;
  let assemblyNumber = 0;
  const addBom = (parentCode: string, childCode: string) =>
    bom.push({ parentCode, childCode, qtyPer: randomInt(random, 1, 4), row: bom.length + 2 });
  for (const product of products) {
    let parents = [product.code];
    for (const width of levels) {
      const next: string[] = [];
      for (const parent of parents) {
        for (let k = 0; k < width; k++) {
          const code = `AS-${pad(++assemblyNumber, 6)}`;
          addBom(parent, code);
          next.push(code);
        }
      }
      parents = next.length > 0 ? next : parents;
    }
    const used = partsAtPlant.get(product.plantCode)!;
    const sharedPool = [...used];
    const leafParents = [product.code, ...parents.filter((code) => code !== product.code)];
    const seenPerParent = new Map<string, Set<string>>();
    for (let k = 0; k < partsPerProduct; k++) {
      const reuse = sharedPool.length > 0 && random() < 0.2;
      const part = reuse ? pick(random, sharedPool) : `PT-${pad(++partNumber, 6)}`;
      const parent = k < leafParents.length ? leafParents[k]! : pick(random, leafParents);
      const seen = seenPerParent.get(parent) ?? new Set<string>();
      if (seen.has(part)) continue;
      seen.add(part);
      seenPerParent.set(parent, seen);
      addBom(parent, part);
      used.add(part);
    }
  }

  const sourcing: SourcingRow[] = [];
  const addRow = (buyerCode: string, itemCode: string, supplierCode: string, isQualified = true) =>
    sourcing.push({
      buyerCode,
      itemCode,
      supplierCode,
      sharePct: null,
      isQualified,
      row: sourcing.length + 2,
    });
  const plantNodes: Array<[string, string]> = [];
  for (const [plant, parts] of partsAtPlant) {
    for (const part of parts) plantNodes.push([plant, part]);
  }
  const sourced = plantNodes.filter(() => random() >= unsourced);
  assignSources(random, sourced, tierOne, dual, unqualified, addRow);

  // Supplier side: each tier-k supplier buys components made by tier k + 1.
  const edgesSoFar = sourcing.filter((r) => r.isQualified).length + bom.length + products.length;
  const buyers = tiers.slice(0, -1).reduce((sum, tier) => sum + tier.length, 0);
  const perBuyer =
    buyers === 0 ? 0 : Math.max(1, Math.round((edgeTarget - edgesSoFar) / (buyers * (2 + dual))));
  for (let k = 0; k + 1 < tiers.length; k++) {
    const pairs: Array<[string, string]> = [];
    for (const buyer of tiers[k]!) {
      for (let j = 0; j < perBuyer; j++) {
        pairs.push([buyer.code, `CM-${k + 2}-${pad(pairs.length + 1, 7)}`]);
      }
    }
    assignSources(random, pairs, tiers[k + 1]!, dual, unqualified, addRow);
  }

  // Supplier cycles: the seller of a component buys a return item from its customer.
  const candidates = sourcing.filter((row) => row.isQualified && !row.buyerCode.startsWith('PL-'));
  const cycleCount = Math.min(options.cycles ?? 0, candidates.length);
  shuffled(random, candidates)
    .slice(0, cycleCount)
    .forEach((row, i) => addRow(row.supplierCode, `RT-${pad(i + 1, 6)}`, row.buyerCode));

  const stock: StockRow[] = [];
  for (const [plantCode, itemCode] of plantNodes) {
    if (random() < stockShare) {
      const weeksOfCover = randomInt(random, 0, 16) / 2;
      stock.push({ plantCode, itemCode, weeksOfCover, row: stock.length + 2 });
    }
  }
  return { plants, products, bom, suppliers, sourcing, stock };
}

function clamp(value: number, low: number, high: number): number {
  return Math.min(high, Math.max(low, value));
}

function makeSuppliers(random: Random, count: number): Supplier[] {
  return Array.from({ length: count }, (_, i) => {
    const [country, region] = pick(random, COUNTRIES);
    return {
      code: `SU-${pad(i + 1, 6)}`,
      name: `Supplier ${i + 1}`,
      country,
      region,
      recoveryWeeks: randomInt(random, 2, 26),
      financialHealth: randomInt(random, 1, 5),
      deliveryScore: randomInt(random, 1, 5),
      hasContinuityPlan: random() < 0.4,
      row: i + 2,
    };
  });
}

/** Splits suppliers into tiers growing with depth (weights 1, 1.5, 2, ...). */
function splitTiers(suppliers: Supplier[], tierCount: number): Supplier[][] {
  const weights = Array.from({ length: tierCount }, (_, k) => 1 + k / 2);
  const total = weights.reduce((a, b) => a + b, 0);
  const tiers: Supplier[][] = [];
  let start = 0;
  for (let k = 0; k < tierCount; k++) {
    const remainingTiers = tierCount - k - 1;
    const share = Math.round((suppliers.length * weights[k]!) / total);
    const size =
      k === tierCount - 1
        ? suppliers.length - start
        : Math.max(1, Math.min(suppliers.length - start - remainingTiers, share));
    tiers.push(suppliers.slice(start, start + size));
    start += size;
  }
  return tiers;
}

/**
 * Gives each (buyer, item) pair a primary source (round robin over a shuffled tier, so that every
 * supplier of the tier sells something when there are enough pairs), a second qualified source
 * with probability `dual`, and an unqualified row with probability `unqualified`. Suppliers left
 * without a customer become second sources of random pairs.
 */
function assignSources(
  random: Random,
  pairs: ReadonlyArray<readonly [string, string]>,
  sellers: readonly Supplier[],
  dual: number,
  unqualified: number,
  addRow: (buyer: string, item: string, supplier: string, isQualified?: boolean) => void,
): void {
  if (sellers.length === 0 || pairs.length === 0) return;
  const order = shuffled(random, sellers);
  const sourcesOf = new Map<string, Set<string>>();
  const add = (buyer: string, item: string, supplier: string, isQualified = true) => {
    const key = `${buyer}\u0000${item}`;
    const set = sourcesOf.get(key) ?? new Set<string>();
    if (set.has(supplier)) return false;
    set.add(supplier);
    sourcesOf.set(key, set);
    addRow(buyer, item, supplier, isQualified);
    return true;
  };
  pairs.forEach(([buyer, item], i) => {
    add(buyer, item, order[i % order.length]!.code);
    if (sellers.length > 1 && random() < dual) add(buyer, item, pick(random, sellers).code);
    if (random() < unqualified) add(buyer, item, pick(random, sellers).code, false);
  });
  for (let i = pairs.length; i < order.length; i++) {
    const [buyer, item] = pick(random, pairs);
    add(buyer, item, order[i]!.code);
  }
}

/**
 * The what-if of a mitigation plan: the plan's proposed changes applied to a copy of a network
 * version, and the plan's supplier failing alone before and after, through the same engine as a
 * run's single removals (`buildSupplyGraph` and `impactOf` of `@keelson/supply-graph`) and the
 * same register score as a run's rows (`@keelson/scoring`). Pure: no database, no clock.
 */
import type {
  PlanChange,
  SourcingRow,
  Supplier,
  SupplyModel,
  WhatIfSideDto,
} from '@keelson/contracts';
import {
  fewestAlternativesBySupplier,
  impactBandOf,
  likelihoodOf,
  registerScore,
  type ScoringSettings,
} from '@keelson/scoring';
import { buildSupplyGraph, compareCodePoints, impactOf } from '@keelson/supply-graph';
import { invalidRequest, notFound } from '../http/app-error';
import { countryKey } from '../runs/run-rows';

/** What the score of a what-if side needs besides the network. */
export interface WhatIfContext {
  /** Country code (upper case) -> hazard 1-5. */
  hazards: ReadonlyMap<string, number>;
  /** The workspace's scoring settings. */
  settings: ScoringSettings;
  /** The register entry's likelihood override, kept on both sides when set. */
  likelihoodOverride: number | null;
}

/** The two sides of a what-if. */
export interface WhatIfSides {
  before: WhatIfSideDto;
  after: WhatIfSideDto;
}

/**
 * A new model with `changes` applied in order (each one checked against the model as the
 * earlier ones left it); `model` is never mutated. `supplierCode` is the plan's supplier: an
 * `add_source` with `buyerCode` null adds the source for every buyer that buys the item from it
 * today (qualified rows). Throws `notFound` when the plan's supplier is not in the model and
 * `invalidRequest` with `details.issues[{path: 'body.changes[i].field', message}]` for the first
 * change that does not fit the network.
 */
export function applyPlanChanges(
  model: SupplyModel,
  supplierCode: string,
  changes: readonly PlanChange[],
): SupplyModel {
  requireSupplier(model, supplierCode);
  // Arrays are copied; rows are replaced, never edited, so the input's rows stay as they were.
  const next: SupplyModel = {
    plants: [...model.plants],
    products: [...model.products],
    bom: [...model.bom],
    suppliers: [...model.suppliers],
    sourcing: [...model.sourcing],
    stock: [...model.stock],
  };
  changes.forEach((change, index) => {
    const at = (field: string) => `body.changes[${index}].${field}`;
    if (change.kind === 'add_source') addSource(next, supplierCode, change, at);
    else if (change.kind === 'raise_cover') raiseCover(next, change, at);
    else setRecovery(next, change, at);
  });
  return next;
}

/**
 * The plan's supplier failing alone on `model` (before) and on `applyPlanChanges(model, ...)`
 * (after): products lost, revenue, time to recover, single point of failure and the register
 * score. Throws as {@link applyPlanChanges}.
 */
export function evaluateWhatIf(
  model: SupplyModel,
  supplierCode: string,
  changes: readonly PlanChange[],
  context: WhatIfContext,
): WhatIfSides {
  requireSupplier(model, supplierCode);
  const changed = applyPlanChanges(model, supplierCode, changes);
  return {
    before: sideOf(model, supplierCode, context),
    after: sideOf(changed, supplierCode, context),
  };
}

/** One side: the single removal of `supplierCode` on `model`, scored like a run's row. */
function sideOf(model: SupplyModel, supplierCode: string, context: WhatIfContext): WhatIfSideDto {
  const graph = buildSupplyGraph(model);
  const impact = impactOf(graph, [supplierCode]);
  // Summed in graph order, as analyse() sums its totals, so the bands agree to the last bit.
  let totalWeeklyRevenue = 0;
  for (const revenue of graph.weeklyRevenue) totalWeeklyRevenue += revenue;
  const impactBand = impactBandOf(impact.revenueImpact, totalWeeklyRevenue, context.settings);
  const likelihood = context.likelihoodOverride ?? computedLikelihood(model, supplierCode, context);
  const score = registerScore(impactBand, likelihood, context.settings);
  return {
    productsLost: [...impact.productsLost].sort(compareCodePoints),
    revenueExposedPerWeek: impact.revenueExposedPerWeek,
    revenueImpact: impact.revenueImpact,
    timeToRecover: impact.timeToRecover,
    // As analyse() defines it (spec section 4): its removal alone loses a product.
    singlePointOfFailure: impact.productsLost.length > 0,
    impactBand,
    likelihood,
    rating: score.rating,
    ratingBand: score.ratingBand,
  };
}

// The inputs buildRunRows (runs/run-rows.ts) gives likelihoodOf, for one supplier; that function
// scores every supplier of an analysis at once, so the per-supplier part is repeated here.
function computedLikelihood(model: SupplyModel, code: string, context: WhatIfContext): number {
  const record = model.suppliers.find((supplier) => supplier.code === code)!;
  return likelihoodOf(
    {
      financialHealth: record.financialHealth,
      deliveryScore: record.deliveryScore,
      hasContinuityPlan: record.hasContinuityPlan,
      fewestAlternatives: fewestAlternativesBySupplier(model).get(code) ?? null,
      countryHazard: context.hazards.get(countryKey(record.country)) ?? null,
    },
    context.settings,
  ).likelihood;
}

type AddSource = Extract<PlanChange, { kind: 'add_source' }>;
type RaiseCover = Extract<PlanChange, { kind: 'raise_cover' }>;
type SetRecovery = Extract<PlanChange, { kind: 'set_recovery' }>;
type PathOf = (field: string) => string;

function addSource(model: SupplyModel, planSupplier: string, change: AddSource, at: PathOf) {
  const { itemCode, supplierCode } = change;
  if (!itemCodesOf(model).has(itemCode)) {
    refuse(at('itemCode'), `the network has no item ${itemCode}`);
  }
  const known = model.suppliers.some((supplier) => supplier.code === supplierCode);
  if (change.newSupplier) {
    if (known) {
      refuse(at('supplierCode'), `${supplierCode} is already a supplier of the network; ` +
        'leave out newSupplier to add it as a source');
    }
    const kind = kindOfCode(model, supplierCode);
    if (kind !== null) {
      refuse(at('supplierCode'), `${supplierCode} is already a ${kind} code of the network; ` +
        'a new supplier needs a code of its own');
    }
  } else if (!known) {
    refuse(at('supplierCode'), `the network has no supplier ${supplierCode}; ` +
      'describe it in newSupplier to add it');
  }
  if (supplierCode === planSupplier) {
    refuse(at('supplierCode'), `${supplierCode} is the plan's own supplier; a second source ` +
      'has to be another supplier');
  }
  const buyers = buyersFor(model, planSupplier, change, at);
  for (const buyer of buyers) {
    if (buyer === supplierCode) {
      refuse(at(change.buyerCode === null ? 'supplierCode' : 'buyerCode'),
        `${supplierCode} buys ${itemCode} itself; a supplier cannot be its own source`);
    }
  }
  if (change.newSupplier) model.suppliers.push(newSupplierRecord(supplierCode, change));
  let added = 0;
  for (const buyer of buyers) {
    const index = model.sourcing.findIndex((row) =>
      row.buyerCode === buyer && row.itemCode === itemCode && row.supplierCode === supplierCode);
    const existing = model.sourcing[index];
    if (existing?.isQualified) continue;
    added++;
    if (existing) model.sourcing[index] = { ...existing, isQualified: true };
    else model.sourcing.push(qualifiedRow(buyer, itemCode, supplierCode));
  }
  if (added === 0) {
    refuse(at('supplierCode'), `${supplierCode} is already a qualified source of ${itemCode} ` +
      `for ${buyers.join(', ')}`);
  }
}

/** The buyers an add_source is for, checked: each one buys or uses the item today. */
function buyersFor(model: SupplyModel, planSupplier: string, change: AddSource, at: PathOf) {
  const { itemCode, buyerCode } = change;
  if (buyerCode === null) {
    const buyers = [...new Set(model.sourcing
      .filter((row) => row.isQualified && row.supplierCode === planSupplier
        && row.itemCode === itemCode)
      .map((row) => row.buyerCode))].sort(compareCodePoints);
    if (buyers.length === 0) {
      refuse(at('itemCode'), `${planSupplier}, the plan's supplier, is not a qualified source ` +
        `of ${itemCode} for anyone; name a buyerCode`);
    }
    return buyers;
  }
  const isPlant = model.plants.some((plant) => plant.code === buyerCode);
  const isSupplier = model.suppliers.some((supplier) => supplier.code === buyerCode);
  if (!isPlant && !isSupplier) {
    refuse(at('buyerCode'), `the network has no plant or supplier ${buyerCode}`);
  }
  if (buyerCode === change.supplierCode) {
    refuse(at('buyerCode'), `${buyerCode} cannot be a source of its own purchases`);
  }
  if (isPlant && madeItemsOf(model).has(itemCode)) {
    refuse(at('itemCode'), `${itemCode} is made at the plants (it has a bill of materials); ` +
      `plant ${buyerCode} cannot buy it`);
  }
  if (!buysOrUses(model, buyerCode, itemCode, isPlant)) {
    // A supplier that gained a row would start to require the item: a new risk, not a source.
    refuse(at('buyerCode'), `${buyerCode} neither buys nor uses ${itemCode} today`);
  }
  return [buyerCode];
}

function raiseCover(model: SupplyModel, change: RaiseCover, at: PathOf) {
  const { plantCode, itemCode, weeksOfCover } = change;
  if (!model.plants.some((plant) => plant.code === plantCode)) {
    refuse(at('plantCode'), `the network has no plant ${plantCode}`);
  }
  if (!itemCodesOf(model).has(itemCode)) {
    refuse(at('itemCode'), `the network has no item ${itemCode}`);
  }
  if (madeItemsOf(model).has(itemCode)) {
    refuse(at('itemCode'), `${itemCode} is made at the plants; the analysis counts the cover ` +
      'of bought items only');
  }
  if (!buysOrUses(model, plantCode, itemCode, true)) {
    refuse(at('itemCode'), `plant ${plantCode} neither buys nor uses ${itemCode} today`);
  }
  const index = model.stock.findIndex((row) =>
    row.plantCode === plantCode && row.itemCode === itemCode);
  if (index === -1) model.stock.push({ plantCode, itemCode, weeksOfCover });
  else model.stock[index] = { ...model.stock[index]!, weeksOfCover };
}

function setRecovery(model: SupplyModel, change: SetRecovery, at: PathOf) {
  const index = model.suppliers.findIndex((supplier) => supplier.code === change.supplierCode);
  if (index === -1) {
    refuse(at('supplierCode'), `the network has no supplier ${change.supplierCode}`);
  }
  model.suppliers[index] = { ...model.suppliers[index]!, recoveryWeeks: change.recoveryWeeks };
}

function requireSupplier(model: SupplyModel, supplierCode: string): void {
  if (!model.suppliers.some((supplier) => supplier.code === supplierCode)) {
    throw notFound(`The network version has no supplier ${supplierCode}.`);
  }
}

function refuse(path: string, message: string): never {
  throw invalidRequest(`${path}: ${message}`, { issues: [{ path, message }] });
}

/** Item codes (spec 8.8): BOM children, BOM parents that are not products, Sourcing, Stock. */
function itemCodesOf(model: SupplyModel): Set<string> {
  const products = new Set(model.products.map((product) => product.code));
  const items = new Set<string>();
  for (const line of model.bom) {
    items.add(line.childCode);
    if (!products.has(line.parentCode)) items.add(line.parentCode);
  }
  for (const row of model.sourcing) items.add(row.itemCode);
  for (const row of model.stock) items.add(row.itemCode);
  return items;
}

/** Items with BOM children: made at every plant that uses them (spec 8.9). */
function madeItemsOf(model: SupplyModel): Set<string> {
  const products = new Set(model.products.map((product) => product.code));
  return new Set(model.bom.map((line) => line.parentCode).filter((code) => !products.has(code)));
}

/** The kind that already uses `code`, or null. */
function kindOfCode(model: SupplyModel, code: string): string | null {
  if (model.plants.some((plant) => plant.code === code)) return 'plant';
  if (model.products.some((product) => product.code === code)) return 'product';
  if (itemCodesOf(model).has(code)) return 'item';
  return null;
}

/** Whether `buyer` has a Sourcing row for `item`, or (a plant) reaches it through its BOM. */
function buysOrUses(model: SupplyModel, buyer: string, item: string, isPlant: boolean): boolean {
  if (model.sourcing.some((row) => row.buyerCode === buyer && row.itemCode === item)) return true;
  if (!isPlant) return false;
  const children = new Map<string, string[]>();
  for (const line of model.bom) {
    children.set(line.parentCode, [...(children.get(line.parentCode) ?? []), line.childCode]);
  }
  const seen = new Set<string>();
  const stack = model.products.filter((p) => p.plantCode === buyer).map((p) => p.code);
  while (stack.length > 0) {
    for (const child of children.get(stack.pop()!) ?? []) {
      if (child === item) return true;
      if (!seen.has(child)) {
        seen.add(child);
        stack.push(child);
      }
    }
  }
  return false;
}

function qualifiedRow(buyerCode: string, itemCode: string, supplierCode: string): SourcingRow {
  return { buyerCode, itemCode, supplierCode, sharePct: null, isQualified: true };
}

function newSupplierRecord(code: string, change: AddSource): Supplier {
  const described = change.newSupplier!;
  // Nothing else is known about a new supplier: unknown scores, as a blank workbook cell.
  return {
    code,
    name: described.name,
    country: described.country,
    region: described.region,
    recoveryWeeks: described.recoveryWeeks,
    financialHealth: null,
    deliveryScore: null,
    hasContinuityPlan: null,
  };
}

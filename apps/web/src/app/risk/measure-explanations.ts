import type { RunSupplierDto } from '@keelson/contracts';

/** A network measure of a supplier with what it means in plain words. */
export interface ExplainedMeasure {
  key: 'betweenness' | 'degree' | 'closeness' | 'eigenvector' | 'pagerank' | 'nexusIndex';
  name: string;
  value: number;
  /** What the measure says about this supplier. */
  meaning: string;
}

const MEASURES: readonly { key: ExplainedMeasure['key']; name: string;
  meaning: (name: string) => string }[] = [
  {
    key: 'betweenness',
    name: 'Betweenness',
    meaning: (name) =>
      `How many of the shortest routes from raw-material suppliers to products pass through ` +
      `${name}: high means it sits between many sources and the products, a bottleneck.`,
  },
  {
    key: 'degree',
    name: 'Degree',
    meaning: (name) =>
      `How many direct links ${name} has (parts it sells, parts it buys) as a share of all ` +
      'nodes: high means many parts and buyers are tied to it directly.',
  },
  {
    key: 'closeness',
    name: 'Closeness',
    meaning: (name) =>
      `How few steps separate ${name} from everything else in the network: high means a ` +
      'problem there reaches the rest quickly.',
  },
  {
    key: 'eigenvector',
    name: 'Eigenvector',
    meaning: (name) =>
      `Whether ${name} is linked to suppliers that are themselves well connected: high means ` +
      'it is part of the densely linked core of the network.',
  },
  {
    key: 'pagerank',
    name: 'PageRank',
    meaning: (name) =>
      `How much of the network's dependence flows towards ${name}, counting links from ` +
      'important buyers more: high means important parts of the network rely on it.',
  },
  {
    key: 'nexusIndex',
    name: 'Nexus index',
    meaning: (name) =>
      `Keelson's own combination, from 0 to 1, of degree, betweenness, closeness and ` +
      `eigenvector, each scaled over all suppliers: how central ${name} is to the network ` +
      'as a whole, whatever its tier or spend.',
  },
];

/** The six measures of a supplier's row, each with its plain explanation. */
export function explainMeasures(row: RunSupplierDto): ExplainedMeasure[] {
  return MEASURES.map(({ key, name, meaning }) => ({
    key,
    name,
    value: row[key],
    meaning: meaning(row.name),
  }));
}

const FACTOR_NAMES: Record<string, string> = {
  financialHealth: 'Financial health',
  deliveryScore: 'Delivery score',
  continuityPlan: 'Continuity plan',
  alternatives: 'Alternative sources',
  countryHazard: 'Country hazard',
};

/** The likelihood factors in words, each a risk from 0 (reassuring) to 1 (worrying). */
export function likelihoodFactorRows(
  factors: Record<string, number>,
): { name: string; risk: number }[] {
  return Object.entries(factors).map(([key, risk]) => ({ name: FACTOR_NAMES[key] ?? key, risk }));
}

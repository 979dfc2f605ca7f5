/** One column of the ranking explained in a plain sentence. */
export interface ColumnHelp {
  readonly column: string;
  readonly meaning: string;
}

/** "What the columns mean": one sentence per column of the ranking, in display order. */
export const RANKING_COLUMN_HELP: readonly ColumnHelp[] = [
  { column: 'Rank', meaning: 'Position by revenue impact, largest first, in this run.' },
  { column: 'Supplier', meaning: 'The supplier’s code and name as imported.' },
  {
    column: 'Tier',
    meaning: 'How far from the plants it sits: 1 sells to a plant, 2 sells to a tier-1 ' +
      'supplier, and so on.',
  },
  { column: 'Country', meaning: 'Where the supplier is, as given in the workbook.' },
  {
    column: 'Products lost',
    meaning: 'Finished products a plant could no longer make if this supplier stopped ' +
      'delivering and nobody else took over.',
  },
  {
    column: 'Revenue exposed / week',
    meaning: 'The weekly revenue of those products added up.',
  },
  {
    column: 'Revenue impact',
    meaning: 'Revenue lost over the outage: for each lost product, its weekly revenue times ' +
      'the weeks left after its stock runs out and before the supplier recovers.',
  },
  {
    column: 'Betweenness',
    meaning: 'How often the supplier lies on the shortest links between other parts of the ' +
      'network (0 to 1); a high value marks a crossroads.',
  },
  {
    column: 'Nexus index',
    meaning: 'How central the supplier is in the network (0 to 1): the average of its scaled ' +
      'degree, betweenness, closeness and eigenvector scores, our own simple measure.',
  },
  {
    column: 'Likelihood',
    meaning: 'A 1-5 estimate of how likely a disruption is, from financial health, delivery ' +
      'score, continuity plan, alternative sources and country hazard.',
  },
  {
    column: 'Impact band',
    meaning: 'Revenue impact placed on a 1-5 scale by the share of a year’s revenue it ' +
      'represents (limits set under Scoring).',
  },
  {
    column: 'Rating',
    meaning: 'Likelihood times impact band (1-25), with its band: low, medium, high or ' +
      'critical.',
  },
];

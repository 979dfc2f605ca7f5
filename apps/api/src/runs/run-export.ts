/**
 * The ranking of a run as a workbook: sheet "Ranking" with every column under a plain header,
 * and sheet "About these numbers" saying what each column means and what the numbers assume.
 */
import ExcelJS from 'exceljs';
import type { RunRecord } from './runs.repository';
import type { StoredRunSupplier } from './run-results.repository';

interface Column {
  header: string;
  explanation: string;
  value: (row: StoredRunSupplier) => string | number | null;
  width?: number;
}

const list = (values: readonly string[]) => values.join(', ');

/** The columns of the ranking sheet, in order, with what each one means. */
export const EXPORT_COLUMNS: readonly Column[] = [
  { header: 'Rank', value: (r) => r.rank, explanation: 'Position by revenue impact (largest ' +
    'first), then by the number of products lost, then by supplier code.' },
  { header: 'Supplier code', value: (r) => r.code, explanation: 'The code from the workbook.' },
  { header: 'Supplier name', value: (r) => r.name, width: 30, explanation: 'As imported.' },
  { header: 'Country', value: (r) => r.country, explanation: 'As imported.' },
  { header: 'Region', value: (r) => r.region, explanation: 'As imported.' },
  { header: 'Tier', value: (r) => r.tier, explanation: '1 sells to a plant; 2 sells to a ' +
    'tier-1 supplier, and so on. Empty: no plant depends on it.' },
  { header: 'Single point of failure', value: (r) => (r.singlePointOfFailure ? 'yes' : 'no'),
    explanation: 'Yes when this supplier failing on its own stops at least one product.' },
  { header: 'Products lost', value: (r) => r.productsLost.length, explanation: 'How many ' +
    'products stop when this supplier alone fails.' },
  { header: 'Products lost (codes)', value: (r) => list(r.productsLost), width: 40,
    explanation: 'Their codes.' },
  { header: 'Plants affected', value: (r) => list(r.plants), explanation: 'The plants that ' +
    'make the lost products.' },
  { header: 'Revenue exposed per week', value: (r) => r.revenueExposedPerWeek, explanation:
    'Sum of the weekly revenue of the lost products.' },
  { header: 'Time to recover (weeks)', value: (r) => r.timeToRecover, explanation: 'The ' +
    "supplier's recovery weeks as given in the workbook." },
  { header: 'Revenue impact', value: (r) => r.revenueImpact, explanation: 'Over the lost ' +
    'products: weekly revenue x the weeks lost after stock cover runs out (time to recover ' +
    'minus time to survive, never below 0).' },
  { header: 'Likelihood (1-5)', value: (r) => r.likelihood, explanation: 'Computed from ' +
    'financial health, delivery score, continuity plan, qualified alternatives and the ' +
    "country's hazard rating, with the weights in the scoring settings. A register override " +
    'does not change this column.' },
  { header: 'Impact band (1-5)', value: (r) => r.impactBand, explanation: 'Revenue impact as ' +
    "a share of a year's revenue of all products, banded by the limits in the scoring " +
    'settings.' },
  { header: 'Rating (1-25)', value: (r) => r.rating, explanation: 'Impact band x likelihood.' },
  { header: 'Rating band', value: (r) => r.ratingBand, explanation: 'Low, medium, high or ' +
    'critical, by the band floors in the scoring settings.' },
  { header: 'Betweenness', value: (r) => r.betweenness, explanation: 'How many raw-material ' +
    'to product routes pass through the supplier (unnormalised).' },
  { header: 'Degree', value: (r) => r.degree, explanation: 'Share of the network the supplier ' +
    'is directly connected to.' },
  { header: 'Closeness', value: (r) => r.closeness, explanation: 'How near the supplier is ' +
    'to the rest of the network (docs/methods.md says whether it was exact or estimated).' },
  { header: 'Eigenvector', value: (r) => r.eigenvector, explanation: 'Connection to other ' +
    'well-connected parts of the network.' },
  { header: 'PageRank', value: (r) => r.pagerank, explanation: 'Another reading of ' +
    'connectedness; all values together sum to 1.' },
  { header: 'Nexus index (0-1)', value: (r) => r.nexusIndex, explanation: 'Our combination ' +
    'of the four network measures: how central the supplier is to the whole network.' },
];

/** The assumptions stated under the column explanations. */
export const EXPORT_ASSUMPTIONS: readonly string[] = [
  'These scores support a decision; they do not make it. Your company\'s own procedures decide.',
  'No re-allocation: when a supplier fails, its share is not moved to the other sources.',
  'Stock cover (weeks) and recovery weeks are taken as given in the imported workbook.',
  'The 5 x 5 matrix of likelihood and impact band is common practice in risk registers, not a ' +
    'standard; its limits and weights are settings an administrator can change.',
];

/** Builds the workbook of a run's ranking. */
export async function runRankingWorkbook(run: RunRecord, rows: readonly StoredRunSupplier[]):
  Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  workbook.creator = 'Keelson';
  const ranking = workbook.addWorksheet('Ranking', { views: [{ state: 'frozen', ySplit: 1 }] });
  ranking.columns = EXPORT_COLUMNS.map((column) => ({ header: column.header,
    width: column.width ?? Math.max(12, column.header.length + 2) }));
  ranking.getRow(1).font = { bold: true };
  for (const row of rows) ranking.addRow(EXPORT_COLUMNS.map((column) => column.value(row)));

  const about = workbook.addWorksheet('About these numbers');
  about.columns = [{ header: 'Column', width: 28 }, { header: 'What it means', width: 100 }];
  about.getRow(1).font = { bold: true };
  for (const column of EXPORT_COLUMNS) about.addRow([column.header, column.explanation]);
  about.addRow([]);
  about.addRow(['Run', `${run.label} (run ${run.id}, network version ${run.networkVersionId}, ` +
    `finished ${run.finishedAt ?? ''})`]);
  for (const assumption of EXPORT_ASSUMPTIONS) about.addRow(['Assumption', assumption]);
  about.getColumn(2).alignment = { wrapText: true, vertical: 'top' };
  return Buffer.from(await workbook.xlsx.writeBuffer());
}

/**
 * The register as a workbook: sheet "Register" with one row per entry (every listed field,
 * plants, owner, the override and its latest reason) and sheet "About these numbers", which says
 * in plain words what the scores mean, what they assume and with which settings they were made.
 */
import ExcelJS from 'exceljs';
import { REGISTER_ABOUT_SHEET } from '@keelson/contracts';
import type { ScoringSettings } from '@keelson/scoring';
import type { RegisterExportRow } from './register.service';

/** Column headers of the "Register" sheet, in order. */
export const REGISTER_EXPORT_COLUMNS = [
  'Id', 'Title', 'Supplier code', 'Supplier name', 'Plants', 'Origin', 'Status', 'Owner',
  'Run', 'Computed likelihood', 'Likelihood override', 'Likelihood', 'Impact band', 'Rating',
  'Rating band', 'Latest override reason', 'Latest override by', 'Latest override at', 'Notes',
  'Created', 'Updated',
] as const;

/** Builds the export workbook's bytes. */
export async function buildRegisterWorkbook(
  rows: readonly RegisterExportRow[],
  settings: ScoringSettings,
  generatedAt: Date,
): Promise<Uint8Array> {
  const workbook = new ExcelJS.Workbook();
  workbook.created = generatedAt;
  const sheet = workbook.addWorksheet('Register', { views: [{ state: 'frozen', ySplit: 1 }] });
  sheet.addRow([...REGISTER_EXPORT_COLUMNS]).font = { bold: true };
  for (const row of rows) {
    sheet.addRow([
      row.id, row.title, row.supplierCode, row.supplierName ?? '', row.plants.join(', '),
      row.origin, row.status, row.owner?.name ?? '', row.runId ?? '', row.computedLikelihood,
      row.likelihoodOverride ?? '', row.likelihood, row.impactBand, row.rating, row.ratingBand,
      row.latestOverride?.reason ?? '', row.latestOverride?.userName ?? '',
      row.latestOverride?.createdAt ?? '', row.notes, row.createdAt, row.updatedAt,
    ]);
  }
  sheet.columns.forEach((column, index) => {
    column.width = [2, 19].includes(index + 1) ? 48 : 16;
  });
  sheet.autoFilter = { from: { row: 1, column: 1 },
    to: { row: 1, column: REGISTER_EXPORT_COLUMNS.length } };

  const about = workbook.addWorksheet(REGISTER_ABOUT_SHEET);
  about.getColumn(1).width = 110;
  for (const line of aboutLines(settings, generatedAt, rows.length)) about.addRow([line]);
  about.getRow(1).font = { bold: true };
  const buffer = await workbook.xlsx.writeBuffer();
  return new Uint8Array(buffer as ArrayBuffer);
}

/** The explanation sheet's lines: meaning, assumptions and the settings in force. */
export function aboutLines(
  settings: ScoringSettings,
  generatedAt: Date,
  entries: number,
): string[] {
  const percent = (share: number) => `${Number((share * 100).toPrecision(6))} %`;
  const [l1, l2, l3, l4] = settings.impactBandLimits;
  const { medium, high, critical } = settings.ratingBandFloors;
  const weights = settings.likelihoodWeights;
  return [
    'About these numbers',
    `Exported ${generatedAt.toISOString()}: ${entries} register entries.`,
    '',
    'Rating = impact band (1-5) x likelihood (1-5), so 1 to 25.',
    'Impact band: the revenue a supplier\'s failure would cost, as a share of a year\'s revenue ' +
      `of all products: below ${percent(l1)} is 1, below ${percent(l2)} is 2, below ` +
      `${percent(l3)} is 3, below ${percent(l4)} is 4, otherwise 5.`,
    'Likelihood: a weighted mean of five factors (financial health, delivery score, ' +
      'continuity plan, qualified alternatives, country hazard) mapped to 1-5; an unknown ' +
      'factor counts as halfway. Weights: financial health ' +
      `${weights.financialHealth}, delivery score ${weights.deliveryScore}, continuity plan ` +
      `${weights.continuityPlan}, alternatives ${weights.alternatives}, country hazard ` +
      `${weights.countryHazard}. A risk manager may override it; the reason is kept.`,
    `Rating bands: low 1-${medium - 1}, medium ${medium}-${high - 1}, high ${high}-` +
      `${critical - 1}, critical ${critical}-25.`,
    '',
    'What the scores assume: no re-allocation of volume between sources when one fails; the ' +
      'stock cover recorded in the network, as given; the recovery weeks recorded for each ' +
      'supplier, as given.',
    'The 5 x 5 matrix is common practice in risk registers, not a standard; an administrator ' +
      'can change every threshold and weight.',
    'These numbers support a decision. The company\'s own procedures decide what is done.',
    'An entry keeps the impact band and computed likelihood of the analysis run it came from ' +
      'until the next run; a manual entry with no run yet has impact band 1.',
  ];
}

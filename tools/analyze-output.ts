import type { AnalysisResult } from '@keelson/supply-graph';

/** A one-line text progress bar for a terminal. */
export function progressBar(fraction: number, stage: string, width = 30): string {
  const clamped = Math.min(1, Math.max(0, fraction));
  const filled = Math.round(clamped * width);
  return `[${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${(clamped * 100).toFixed(0).padStart(3)} % ${stage.padEnd(24)}`;
}

const money = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/**
 * The ranking as a plain text table: suppliers by revenue impact, then products lost, then code.
 * Shows the first `top` rows, then the scenario when there is one, then the warning count.
 */
export function formatRanking(result: AnalysisResult & { warnings?: unknown[] }, top: number): string {
  const ranked = [...result.suppliers].sort(
    (a, b) =>
      b.revenueImpact - a.revenueImpact ||
      b.productsLost.length - a.productsLost.length ||
      (a.code < b.code ? -1 : a.code > b.code ? 1 : 0),
  );
  const header = ['#', 'supplier', 'tier', 'lost', 'exposed / week', 'revenue impact', 'SPOF', 'betweenness'];
  const rows = ranked.slice(0, top).map((s, index) => [
    String(index + 1),
    s.code,
    s.tier === null ? '-' : String(s.tier),
    String(s.productsLost.length),
    money.format(s.revenueExposedPerWeek),
    money.format(s.revenueImpact),
    s.singlePointOfFailure ? 'yes' : '',
    s.betweenness.toFixed(1),
  ]);
  const widths = header.map((title, column) => Math.max(title.length, ...rows.map((row) => row[column]!.length)));
  const line = (cells: string[]) =>
    cells.map((cell, column) => (column === 1 ? cell.padEnd(widths[column]!) : cell.padStart(widths[column]!))).join('  ');
  const singlePoints = result.suppliers.filter((s) => s.singlePointOfFailure).length;
  const out = [
    `${result.suppliers.length} suppliers, ${singlePoints} single points of failure` +
      (top < ranked.length ? `; the top ${top} by revenue impact:` : ':'),
    '',
    line(header),
    line(widths.map((width) => '-'.repeat(width))),
    ...rows.map(line),
  ];
  if (result.scenario) {
    const s = result.scenario;
    out.push(
      '',
      `Scenario: ${s.failed.length} supplier(s) fail (${s.failed.slice(0, 8).join(', ')}${s.failed.length > 8 ? ', ...' : ''})`,
      `  products lost: ${s.productsLost.length}${s.productsLost.length ? ` (${s.productsLost.slice(0, 10).join(', ')}${s.productsLost.length > 10 ? ', ...' : ''})` : ''}`,
      `  revenue exposed per week: ${money.format(s.revenueExposedPerWeek)}`,
      `  revenue impact: ${money.format(s.revenueImpact)}`,
    );
  }
  const method = result.methods.closeness;
  if (method.method === 'sampled') {
    out.push('', `Closeness estimated from ${method.pivots} pivots (largest relative standard error ` +
      `${(100 * method.maxRelativeStandardError).toFixed(2)} %); --closeness exact computes it exactly.`);
  }
  if (result.warnings?.length) out.push('', `${result.warnings.length} warning(s) in the workbook (see the JSON).`);
  return `${out.join('\n')}\n`;
}

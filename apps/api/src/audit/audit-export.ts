/**
 * The audit trail as a workbook: sheet "Audit trail" with one row per event (when, who, action,
 * subject, before, after as JSON text), newest first, and sheet "About", which says what the
 * trail is and that it is append-only.
 */
import ExcelJS from 'exceljs';
import type { AuditEventDto, ExportAuditQuery } from '@keelson/contracts';

/** Column headers of the "Audit trail" sheet, in order. */
export const AUDIT_EXPORT_COLUMNS = [
  'When (UTC)', 'Who', 'Action', 'Subject', 'Before', 'After',
] as const;

/** Name of the explanation sheet. */
export const AUDIT_ABOUT_SHEET = 'About';

/** Builds the export workbook's bytes. */
export async function buildAuditWorkbook(
  events: readonly AuditEventDto[],
  filters: ExportAuditQuery,
  generatedAt: Date,
): Promise<Uint8Array> {
  const workbook = new ExcelJS.Workbook();
  workbook.created = generatedAt;
  const sheet = workbook.addWorksheet('Audit trail', { views: [{ state: 'frozen', ySplit: 1 }] });
  sheet.addRow([...AUDIT_EXPORT_COLUMNS]).font = { bold: true };
  for (const event of events) {
    sheet.addRow([
      event.createdAt,
      event.user?.name ?? 'Keelson (system)',
      event.action,
      `${event.subjectType} ${event.subjectId}`,
      event.before === null ? '' : JSON.stringify(event.before),
      event.after === null ? '' : JSON.stringify(event.after),
    ]);
  }
  [26, 22, 30, 24, 60, 60].forEach((width, index) => {
    sheet.getColumn(index + 1).width = width;
  });
  sheet.autoFilter = { from: { row: 1, column: 1 },
    to: { row: 1, column: AUDIT_EXPORT_COLUMNS.length } };

  const about = workbook.addWorksheet(AUDIT_ABOUT_SHEET);
  about.getColumn(1).width = 110;
  for (const line of auditAboutLines(filters, generatedAt, events.length)) about.addRow([line]);
  about.getRow(1).font = { bold: true };
  const buffer = await workbook.xlsx.writeBuffer();
  return new Uint8Array(buffer as ArrayBuffer);
}

/** The explanation sheet's lines. */
export function auditAboutLines(
  filters: ExportAuditQuery,
  generatedAt: Date,
  events: number,
): string[] {
  const used = Object.entries(filters).filter(([, value]) => value !== undefined && value !== '');
  return [
    'About this audit trail',
    `Exported ${generatedAt.toISOString()}: ${events} events, newest first.`,
    used.length === 0
      ? 'Filters: none (the whole trail).'
      : `Filters: ${used.map(([key, value]) => `${key} = ${String(value)}`).join('; ')}.`,
    '',
    'Every change that matters is recorded: imports, analysis runs, likelihood overrides, ' +
      'register edits, mitigation plans and their decisions, tasks, and user and role changes.',
    'Each row says when (UTC), who (Keelson for the system), what (the action), on which ' +
      'subject, and the fields before and after the change as JSON.',
    'The trail is append-only: the database refuses to change or delete a record, and no ' +
      'route of the application changes or deletes one. A record is written in the same ' +
      'transaction as the change it describes.',
    'Passwords and invitation links are never recorded.',
  ];
}

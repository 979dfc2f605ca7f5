import type { ImportStatus } from '@keelson/contracts';

/** What each batch status is called on screen. */
export const IMPORT_STATUS_LABELS: Record<ImportStatus, string> = {
  needs_mapping: 'Needs mapping',
  rejected: 'Has errors',
  ready: 'Ready to commit',
  committed: 'Committed',
};

/** One sentence per status for the check step, saying what the buyer can do next. */
export const IMPORT_STATUS_HINTS: Record<ImportStatus, string> = {
  needs_mapping:
    'Some required sheets or columns were not found under their template names. ' +
    'Map them to the columns of your file.',
  rejected:
    'The file was read, but it has errors. Correct them in your file and upload it again, ' +
    'or change the mapping.',
  ready: 'The file has no errors. You can commit it as a new network version.',
  committed: 'This file has been committed as a network version.',
};

/** The check step's sentence for a file that could not be read as a spreadsheet at all. */
export const UNREADABLE_FILE_HINT =
  'Keelson could not read this file as a spreadsheet; the error below says why. Upload an ' +
  'Excel workbook (.xlsx), a CSV file or a zip of CSV files instead.';

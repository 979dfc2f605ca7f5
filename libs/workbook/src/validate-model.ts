/**
 * Validation of a typed supply model (spec 1.1 and 8.4-8.10, 8.16): values and ranges,
 * duplicates, kinds and references, made-and-bought, BOM cycles, and the warnings. The reader
 * runs it on what it parsed, with a locator that names the file's sheets and cells; models built
 * in code use the template's sheet names.
 */
import {
  SHEET_NAMES,
  type SupplyModel,
  type WorkbookError,
  type WorkbookWarning,
} from '@keelson/contracts';
import { checkBomCycles } from './bom-cycles';
import {
  checkDuplicates,
  checkValues,
  collectCodes,
  type IncompleteSheets,
} from './model-checks';
import { checkKinds, checkMadeAndBought, checkReferences } from './model-references';
import { collectWarnings } from './model-warnings';
import { errorFactory, TEMPLATE_LOCATOR, type ProblemLocator } from './problem-locator';
import { sheetOrderOf, sortErrors, sortWarnings } from './problems';

/** Errors and warnings of a model. */
export interface ModelProblems {
  errors: WorkbookError[];
  warnings: WorkbookWarning[];
}

/** Options of {@link checkModel}. */
export interface CheckModelOptions {
  locator?: ProblemLocator;
  /** Sheets that could not be read whole: references into them are not checked. */
  incompleteSheets?: IncompleteSheets;
}

/** Every model-level rule, unsorted. */
export function checkModel(model: SupplyModel, options: CheckModelOptions = {}): ModelProblems {
  const locator = options.locator ?? TEMPLATE_LOCATOR;
  const makeError = errorFactory(locator);
  const codes = collectCodes(model);
  const errors = [
    ...checkValues(model, makeError),
    ...checkDuplicates(model, makeError),
    ...checkKinds(model, codes, makeError),
    ...checkReferences(model, codes, options.incompleteSheets ?? new Set(), makeError),
    ...checkMadeAndBought(model, codes, makeError),
    ...checkBomCycles(model.bom, makeError),
  ];
  return { errors, warnings: collectWarnings(model, codes, locator) };
}

/**
 * Validates a model built in code or parsed from a file: field values and ranges (spec 8.4),
 * duplicate keys (8.7), one kind per code and references between sheets (8.8), items both made
 * and bought at a plant (8.9) and BOM cycles (8.10), plus the warnings of 8.16. Problems name the
 * template's sheets and are sorted by sheet (workbook order), then row.
 */
export function validateModel(model: SupplyModel): ModelProblems {
  const { errors, warnings } = checkModel(model);
  const order = sheetOrderOf(SHEET_NAMES, []);
  return { errors: sortErrors(errors, order), warnings: sortWarnings(warnings, order) };
}

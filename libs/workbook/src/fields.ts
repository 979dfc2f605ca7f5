/**
 * `@keelson/workbook/fields`: the template's column table alone, for the browser's mapping step.
 * It imports nothing but contracts, so the web client gets the field list without exceljs.
 */
export {
  REQUIRED_SHEETS,
  SHEET_HELP,
  TEMPLATE_FIELDS,
  type FieldKind,
  type FieldRange,
  type TemplateField,
} from './template-fields';

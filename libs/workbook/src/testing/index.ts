/**
 * `@keelson/workbook/testing`: the fixtures of the workbook specs for other packages' specs (the
 * API's imports): the small hand-made network as sheets and as the model it must read to, and
 * builders of .xlsx, CSV and zip bytes, so no binary fixture is committed anywhere.
 */
export {
  buildXlsx,
  buildZip,
  smallNetworkModel,
  smallNetworkSheets,
  toCsv,
  utf8,
  type SheetRows,
} from '../fixture-workbooks';

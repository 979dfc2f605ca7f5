import type { Response } from 'express';

/** The media type of an .xlsx workbook. */
export const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';

/** Answers 200 with workbook `bytes` as a download named `fileName`. */
export function sendXlsx(res: Response, bytes: Uint8Array, fileName: string): void {
  res.status(200).type(XLSX_TYPE).attachment(fileName)
    .send(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength));
}

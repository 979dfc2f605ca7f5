/**
 * The multipart upload of one file (multer, memory storage): the bytes go straight to the
 * service, which tells the type by content. Multer's errors become clear API errors: 413
 * `file_too_large` naming the limit in MB, 400 for a missing, extra or malformed part.
 */
import type { RequestHandler } from 'express';
import multer from 'multer';
import { FILE_TOO_LARGE } from '@keelson/contracts';
import { AppError, invalidRequest } from '../http/app-error';

/** The multipart field that carries the file. */
export const FILE_FIELD = 'file';

const MEGABYTE = 1024 * 1024;

/** A byte count in MB for messages: "20 MB", "0.0625 MB". */
export function megabytes(bytes: number): string {
  return `${Number((bytes / MEGABYTE).toPrecision(3))} MB`;
}

/** Parses a multipart body with at most one file, in the field {@link FILE_FIELD}. */
export function singleFileUpload(maxBytes: number): RequestHandler {
  const upload = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: maxBytes, files: 1, fields: 20, fieldSize: 1024 * 1024, parts: 25 },
    // Browsers send UTF-8 file names; busboy's default (latin1) would garble "Łódź.xlsx".
    defParamCharset: 'utf8',
  }).single(FILE_FIELD);
  return (req, res, next) => {
    upload(req, res, (error: unknown) => {
      next(error === undefined || error === null ? undefined : uploadError(error, maxBytes));
    });
  };
}

function uploadError(error: unknown, maxBytes: number): AppError {
  if (error instanceof multer.MulterError) {
    switch (error.code) {
      case 'LIMIT_FILE_SIZE':
        return new AppError(FILE_TOO_LARGE, 413, `The file is larger than the upload limit of ` +
          `${megabytes(maxBytes)}. Split it, or remove sheets the import does not read.`,
        { limitBytes: maxBytes });
      case 'LIMIT_UNEXPECTED_FILE':
      case 'LIMIT_FILE_COUNT':
        return invalidRequest(`Send exactly one file, in the multipart field "${FILE_FIELD}"` +
          `${error.field && error.field !== FILE_FIELD ? ` (not "${error.field}")` : ''}.`,
        { issues: [{ path: `body.${error.field ?? FILE_FIELD}`, message: error.message }] });
      default:
        return invalidRequest(`The upload could not be read: ${error.message}.`,
          { issues: [{ path: `body.${error.field ?? ''}`, message: error.message }] });
    }
  }
  const detail = error instanceof Error ? error.message : String(error);
  return invalidRequest(`The multipart body could not be read (${detail}).`);
}

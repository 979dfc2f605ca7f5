import { Router, type Response } from 'express';
import { z } from 'zod';
import {
  checkImportSchema,
  listImportBatchesQuerySchema,
  listImportProblemsQuerySchema,
  workbookMappingSchema,
  type ImportLimitsDto,
  type Role,
  type WorkbookMapping,
} from '@keelson/contracts';
import { invalidRequest } from '../http/app-error';
import { sessionUser } from '../http/auth-context';
import { parseInput } from '../http/parse-input';
import { route, SIGNED_IN } from '../http/route';
import { XLSX_TYPE } from '../http/xlsx-response';
import type { ImportsService, MappingChoice } from './imports.service';
import { FILE_FIELD, singleFileUpload } from './upload-middleware';

/** Who uploads, checks and commits. */
export const IMPORT_WRITERS: readonly [Role, ...Role[]] = ['admin', 'buyer'];

/**
 * Who reads a stored file's contents (inspection, problems, error report). Plant managers are
 * left out: a file covers every plant, and they see only their own plants' data.
 */
export const IMPORT_CONTENT_READERS: readonly [Role, ...Role[]] =
  ['admin', 'buyer', 'risk_manager', 'viewer'];

/** The media type of .xlsx downloads. */

const idParams = z.object({ id: z.coerce.number().int().positive() });
const mappingId = z.coerce.number().int().positive();
const uploadQuery = z.object({
  commit: z.enum(['true', 'false']).optional(),
  mapping: mappingId.optional(),
});
const uploadFields = z.object({
  mapping: mappingId.optional(),
  mappingJson: z.string().max(100_000).optional(),
});
const inspectionQuery = z.object({ mappingId: mappingId.optional() });

/** Options of {@link createImportsRouter}. */
export interface ImportsRouterOptions {
  /** The upload limit in bytes (`UPLOAD_MAX_BYTES`). */
  uploadMaxBytes: number;
}

/** `/api/imports`: upload, check, map, inspect, report and commit a buyer's file. */
export function createImportsRouter(service: ImportsService, options: ImportsRouterOptions) {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/template.xlsx',
    roles: SIGNED_IN,
    handler: async (_req, res) => {
      sendXlsx(res, 'keelson-template.xlsx', await service.template());
    },
  });
  route(router, {
    method: 'get',
    path: '/limits',
    roles: SIGNED_IN,
    handler: (_req, res) => {
      const limits: ImportLimitsDto = { uploadMaxBytes: options.uploadMaxBytes };
      res.json(limits);
    },
  });
  route(router, {
    method: 'get',
    path: '/',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(service.list(parseInput(listImportBatchesQuerySchema, req.query, 'query')));
    },
  });
  route(router, {
    method: 'post',
    path: '/',
    roles: IMPORT_WRITERS,
    before: [singleFileUpload(options.uploadMaxBytes)],
    handler: async (req, res) => {
      const query = parseInput(uploadQuery, req.query, 'query');
      const fields = parseInput(uploadFields, { ...req.body }, 'body');
      if (!req.file) {
        throw invalidRequest(`Send the file as multipart/form-data in the field "${FILE_FIELD}".`,
          { issues: [{ path: `body.${FILE_FIELD}`, message: 'no file was sent' }] });
      }
      const choice = mappingChoice(fields.mapping ?? query.mapping, fields.mappingJson);
      const file = { fileName: req.file.originalname, data: new Uint8Array(req.file.buffer) };
      const actor = sessionUser(req);
      if (query.commit === 'true') {
        res.status(201).json(await service.uploadAndCommit(actor, file, choice));
      } else {
        res.status(201).json((await service.upload(actor, file, choice)).batch);
      }
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: SIGNED_IN,
    handler: (req, res) => {
      res.json(service.get(parseInput(idParams, req.params, 'params').id));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/inspection',
    roles: IMPORT_CONTENT_READERS,
    handler: async (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const query = parseInput(inspectionQuery, req.query, 'query');
      res.json(await service.inspection(id, query.mappingId));
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/check',
    roles: IMPORT_WRITERS,
    handler: async (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const body = parseInput(checkImportSchema, req.body, 'body');
      if (body.mapping !== undefined && body.mappingId !== undefined) {
        throw bothMappings('body.mappingId');
      }
      res.json(await service.check(id, body));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/problems',
    roles: IMPORT_CONTENT_READERS,
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(service.problems(id, parseInput(listImportProblemsQuerySchema, req.query,
        'query')));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id/error-report.xlsx',
    roles: IMPORT_CONTENT_READERS,
    handler: async (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      const report = await service.errorReport(id);
      sendXlsx(res, report.fileName, report.data);
    },
  });
  route(router, {
    method: 'post',
    path: '/:id/commit',
    roles: IMPORT_WRITERS,
    handler: async (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.status(201).json(await service.commit(sessionUser(req), id));
    },
  });
  return router;
}

/** A saved mapping id or a mapping sent as JSON text (not both). */
function mappingChoice(id: number | undefined, json: string | undefined): MappingChoice {
  if (json === undefined) {
    return { mappingId: id };
  }
  if (id !== undefined) {
    throw bothMappings('body.mappingJson');
  }
  let value: unknown;
  try {
    value = JSON.parse(json);
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    throw invalidRequest(`The request is not valid: body.mappingJson is not JSON (${reason}).`,
      { issues: [{ path: 'body.mappingJson', message: 'not valid JSON' }] });
  }
  const parsed = workbookMappingSchema.safeParse(value);
  if (!parsed.success) {
    const issues = parsed.error.issues.map((issue) => ({
      path: ['body.mappingJson', ...issue.path.map(String)].join('.'),
      message: issue.message,
    }));
    throw invalidRequest(`The request is not valid: ${issues[0]!.path}: ${issues[0]!.message}`,
      { issues });
  }
  return { mapping: parsed.data as WorkbookMapping };
}

function bothMappings(path: string) {
  return invalidRequest('Give either a saved mapping id or a mapping, not both.',
    { issues: [{ path, message: 'give one mapping only' }] });
}

/** Sends an .xlsx as an attachment (the name encoded for any characters). */
function sendXlsx(res: Response, fileName: string, data: Uint8Array): void {
  res.attachment(fileName);
  res.type(XLSX_TYPE);
  res.setHeader('Cache-Control', 'no-store');
  res.send(Buffer.from(data.buffer, data.byteOffset, data.byteLength));
}

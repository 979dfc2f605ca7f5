import { Router } from 'express';
import { z } from 'zod';
import { pageQuerySchema, type MailOutboxDto, type MailOutboxSentDto } from '@keelson/contracts';
import { parseInput } from '../http/parse-input';
import { route } from '../http/route';
import type { MailOutbox } from './mail-outbox';
import type { MailService } from './mail.service';

const idParams = z.object({ id: z.coerce.number().int().positive() });

/**
 * `/api/admin/mail`: the messages caught by the local SMTP sink, and the outbox of notification
 * e-mails the SMTP server has not taken yet (with "send them now").
 */
export function createMailRouter(service: MailService, outbox: MailOutbox): Router {
  const router = Router();
  route(router, {
    method: 'get',
    path: '/outbox',
    roles: ['admin'],
    handler: (_req, res) => {
      const body: MailOutboxDto = { ...outbox.counts(), items: outbox.unsent().map((row) => ({
        id: row.id, kind: row.kind, to: row.toAddresses, subject: row.subject,
        status: row.status === 'failed' ? 'failed' : 'pending', attempts: row.attempts,
        nextAttemptAt: row.nextAttemptAt, lastError: row.lastError, createdAt: row.createdAt })) };
      res.json(body);
    },
  });
  route(router, {
    method: 'post',
    path: '/outbox/send',
    roles: ['admin'],
    handler: async (_req, res) => {
      const sent = await outbox.sendUnsentNow();
      const { pending, failed } = outbox.counts();
      const body: MailOutboxSentDto = { sent, unsent: pending + failed };
      res.json(body);
    },
  });
  route(router, {
    method: 'get',
    path: '/',
    roles: ['admin'],
    handler: (req, res) => {
      res.json(service.list(parseInput(pageQuerySchema, req.query, 'query')));
    },
  });
  route(router, {
    method: 'get',
    path: '/:id',
    roles: ['admin'],
    handler: (req, res) => {
      const { id } = parseInput(idParams, req.params, 'params');
      res.json(service.get(id));
    },
  });
  return router;
}

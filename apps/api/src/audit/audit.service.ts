/**
 * The audit trail for reading: administrators filter and export the whole trail; anyone who may
 * read a register entry or a plan reads its history (plant managers only within their plants).
 */
import type {
  AuditEventDto,
  AuditHistoryDto,
  AuditListDto,
  ExportAuditQuery,
  ListAuditQuery,
} from '@keelson/contracts';
import { forbidden, invalidRequest, notFound } from '../http/app-error';
import type { SessionUser } from '../http/auth-context';
import { plantScopeOf } from '../network/plant-scope';
import { auditWhere, type AuditRepository } from './audit.repository';

/** Subject types whose history anyone who may read the subject sees; others: admins only. */
export const SHARED_HISTORY_TYPES = ['register_entry', 'plan'] as const;

// Subject types in words, for messages ("the history of an analysis run").
const SUBJECT_WORDS: Record<string, string> = {
  user: 'a user',
  analysis_run: 'an analysis run',
  network_version: 'a network version',
  plan_task: 'a plan task',
};

/** Reads of the audit trail. */
export class AuditService {
  constructor(private readonly repository: AuditRepository) {}

  /** One page of the filtered trail, newest first, and the total of matches. */
  list(query: ListAuditQuery): AuditListDto {
    const where = auditWhere(query);
    return {
      items: this.repository.list(where, { limit: query.limit, offset: query.offset }),
      total: this.repository.count(where),
    };
  }

  /** Every event matching the filters, newest first (for the workbook). */
  exportRows(query: ExportAuditQuery): AuditEventDto[] {
    return this.repository.list(auditWhere(query));
  }

  /**
   * One subject's history, newest first. A register entry's holds its plans' and their tasks'
   * events; a plan's its tasks'. 404 when the entry or plan does not exist or a plant manager's
   * plants do not include one of its plants; 403 for other subject types unless an admin asks.
   */
  history(user: SessionUser, subjectType: string, subjectId: string): AuditHistoryDto {
    if (subjectType === 'register_entry' || subjectType === 'plan') {
      const id = positiveId(subjectId);
      const entryId = subjectType === 'plan' ? this.repository.entryOfPlan(id) : id;
      const what = subjectType === 'plan' ? `Plan ${id}` : `Register entry ${id}`;
      if (entryId === undefined || !this.repository.entryExists(entryId)) {
        throw notFound(`${what} was not found.`);
      }
      const scope = plantScopeOf(user);
      if (scope !== null) {
        const plants = this.repository.entryPlants(entryId);
        if (!plants.some((plant) => scope.includes(plant))) {
          throw notFound(`${what} was not found.`);
        }
      }
      const where = subjectType === 'plan'
        ? this.repository.planHistoryWhere(id)
        : this.repository.entryHistoryWhere(id);
      return { items: this.repository.list(where) };
    }
    if (user.role !== 'admin') {
      throw forbidden(
        `The history of ${SUBJECT_WORDS[subjectType] ?? `a ${subjectType}`} is for ` +
          'administrators; everyone who may read a register entry or a plan may read its history.',
        { subjectType, sharedTypes: [...SHARED_HISTORY_TYPES] },
      );
    }
    return { items: this.repository.list(this.repository.subjectWhere(subjectType, subjectId)) };
  }
}

function positiveId(value: string): number {
  const id = Number(value);
  if (!/^\d+$/.test(value) || !Number.isSafeInteger(id) || id < 1) {
    throw invalidRequest('params.subjectId: a register entry or plan id is a positive number.', {
      issues: [{ path: 'params.subjectId', message: 'A positive whole number.' }],
    });
  }
  return id;
}

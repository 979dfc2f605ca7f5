import { and, inArray, isNotNull, lt, type SQL } from 'drizzle-orm';
import { mitigationPlans, planTasks } from '@keelson/db';
import { ACTIVE_STATUSES } from './plan-rules';

/**
 * `isTaskOverdue` of plan-rules.ts as SQL, for a query of `plan_tasks` joined to
 * `mitigation_plans`: to do or doing, due before `today` (YYYY-MM-DD), on a plan whose tasks
 * are active. The dashboard's counts and the weekly digest both use it, so "overdue" means the
 * same everywhere.
 */
export function overdueTaskCondition(today: string): SQL {
  return and(inArray(planTasks.status, ['todo', 'doing']), isNotNull(planTasks.dueDate),
    lt(planTasks.dueDate, today), inArray(mitigationPlans.status, [...ACTIVE_STATUSES]))!;
}

/**
 * A task list as a workbook: sheet "Tasks" with the rows of the tasks page in its order (overdue
 * first), and sheet "About", which says whose tasks, which ones and what "overdue" means.
 */
import ExcelJS from 'exceljs';
import {
  PLAN_STATUS_LABELS,
  PLAN_STRATEGY_LABELS,
  TASK_STATUS_LABELS,
  type MyTaskDto,
  type TaskListShow,
} from '@keelson/contracts';

/** Column headers of the "Tasks" sheet, in order. */
export const TASKS_EXPORT_COLUMNS = ['Task', 'Owner', 'Status', 'Due', 'Overdue', 'Plan',
  'Plan status', 'Register entry', 'Supplier'] as const;

/** Whose tasks and which: the list the workbook holds. */
export interface TasksExportScope {
  /** `mine`: the signed-in person's (named); `everyone`: every owner's. */
  whose: { mine: string } | 'everyone';
  show: TaskListShow;
}

const SHOW_WORDS: Record<TaskListShow, string> = {
  open: 'open tasks (to do or doing)',
  overdue: 'overdue tasks',
  all: 'tasks in every status, also those of finished plans',
};

/** Builds the export workbook's bytes. */
export async function buildTasksWorkbook(tasks: readonly MyTaskDto[], scope: TasksExportScope,
  generatedAt: Date, today: string): Promise<Uint8Array> {
  const workbook = new ExcelJS.Workbook();
  workbook.created = generatedAt;
  const sheet = workbook.addWorksheet('Tasks', { views: [{ state: 'frozen', ySplit: 1 }] });
  sheet.addRow([...TASKS_EXPORT_COLUMNS]).font = { bold: true };
  for (const task of tasks) {
    const row = sheet.addRow([
      task.title,
      task.owner?.name ?? '',
      task.isActive ? TASK_STATUS_LABELS[task.status] : `${TASK_STATUS_LABELS[task.status]} ` +
        '(starts on approval)',
      task.dueDate ?? '',
      task.isOverdue ? 'yes' : '',
      `Plan ${task.plan.id}: ${PLAN_STRATEGY_LABELS[task.plan.strategy]}`,
      PLAN_STATUS_LABELS[task.plan.status],
      `No. ${task.plan.entry.id} ${task.plan.entry.title}`,
      task.plan.entry.supplierCode,
    ]);
    if (task.isOverdue) row.getCell(5).font = { bold: true, color: { argb: 'FFB3261E' } };
  }
  [44, 22, 26, 12, 9, 30, 14, 48, 16].forEach((width, index) => {
    sheet.getColumn(index + 1).width = width;
  });
  sheet.autoFilter = { from: { row: 1, column: 1 },
    to: { row: 1, column: TASKS_EXPORT_COLUMNS.length } };

  const about = workbook.addWorksheet('About');
  about.getColumn(1).width = 110;
  for (const line of tasksAboutLines(scope, generatedAt, today, tasks.length)) about.addRow([line]);
  about.getRow(1).font = { bold: true };
  const buffer = await workbook.xlsx.writeBuffer();
  return new Uint8Array(buffer as ArrayBuffer);
}

/** The explanation sheet's lines. */
export function tasksAboutLines(scope: TasksExportScope, generatedAt: Date, today: string,
  count: number): string[] {
  const whose = scope.whose === 'everyone' ? 'everyone\'s' : `${scope.whose.mine}'s`;
  return [
    'About this task list',
    `Exported ${generatedAt.toISOString()}: ${count} of ${whose} ${SHOW_WORDS[scope.show]}, ` +
      'overdue first, then by due date (none last).',
    `A task is overdue when its due date is before ${today} (today, UTC) and it is to do or ` +
      'doing, on an approved or in-progress plan.',
    'Tasks start once every plant manager concerned has approved their plan. The plans and ' +
      'their numbers are decision support; your company\'s own procedures decide.',
  ];
}

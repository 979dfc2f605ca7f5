import {
  type AbstractControl,
  FormArray,
  FormControl,
  FormGroup,
  type ValidationErrors,
  Validators,
} from '@angular/forms';
import type {
  CreatePlanInput,
  PlanChange,
  PlanChangeKind,
  PlanDto,
  PlanStrategy,
  PlanTaskDto,
} from '@keelson/contracts';
import { fromIsoDate, toIsoDate } from './plan-labels';

/** A value that must hold more than white space (the server trims before it checks). */
export function requiredTrimmed(control: AbstractControl<string>): ValidationErrors | null {
  return (control.value ?? '').trim().length === 0 ? { required: true } : null;
}

/** One proposed change as the editor holds it; the kind decides which fields count. */
export type ChangeForm = FormGroup<{
  kind: FormControl<PlanChangeKind>;
  itemCode: FormControl<string>;
  supplierCode: FormControl<string>;
  isEveryBuyer: FormControl<boolean>;
  buyerCode: FormControl<string>;
  plantCode: FormControl<string>;
  weeks: FormControl<number | null>;
}>;

/** One task row: `id` null until the server has it. */
export type TaskForm = FormGroup<{
  id: FormControl<number | null>;
  title: FormControl<string>;
  ownerId: FormControl<number | null>;
  dueDate: FormControl<Date | null>;
}>;

/** The whole plan editor's form. */
export type PlanForm = FormGroup<{
  strategy: FormControl<PlanStrategy | null>;
  description: FormControl<string>;
  estimatedCost: FormControl<number | null>;
  targetDate: FormControl<Date | null>;
  changes: FormArray<ChangeForm>;
  tasks: FormArray<TaskForm>;
}>;

const CODE = [requiredTrimmed, Validators.maxLength(60)];
const WEEKS = [Validators.required, Validators.min(0), Validators.max(520)];

function text(value: string, validators: ((c: AbstractControl) => ValidationErrors | null)[] = []):
  FormControl<string> {
  return new FormControl(value, { nonNullable: true, validators });
}

/** A change row of `kind`, filled from `change` when editing one the plan already has. */
export function changeForm(kind: PlanChangeKind, change?: PlanChange): ChangeForm {
  const add = change?.kind === 'add_source' ? change : null;
  const cover = change?.kind === 'raise_cover' ? change : null;
  const recovery = change?.kind === 'set_recovery' ? change : null;
  const needs = (...kinds: PlanChangeKind[]) => kinds.includes(kind);
  const group: ChangeForm = new FormGroup({
    kind: new FormControl(kind, { nonNullable: true }),
    itemCode: text(add?.itemCode ?? cover?.itemCode ?? '',
      needs('add_source', 'raise_cover') ? CODE : []),
    supplierCode: text(add?.supplierCode ?? recovery?.supplierCode ?? '',
      needs('add_source', 'set_recovery') ? CODE : []),
    isEveryBuyer: new FormControl(add ? add.buyerCode === null : true, { nonNullable: true }),
    buyerCode: text(add?.buyerCode ?? '', [Validators.maxLength(60)]),
    plantCode: text(cover?.plantCode ?? '', needs('raise_cover') ? CODE : []),
    weeks: new FormControl<number | null>(cover?.weeksOfCover ?? recovery?.recoveryWeeks ?? null,
      needs('raise_cover', 'set_recovery') ? WEEKS : []),
  });
  if (kind === 'add_source') {
    // "Every buyer" leaves the buyer out; a named buyer is then required.
    const sync = (isEvery: boolean) => {
      const buyer = group.controls.buyerCode;
      buyer.setValidators(isEvery ? [] : CODE);
      if (isEvery) buyer.disable({ emitEvent: false });
      else buyer.enable({ emitEvent: false });
      buyer.updateValueAndValidity({ emitEvent: false });
    };
    sync(group.controls.isEveryBuyer.value);
    group.controls.isEveryBuyer.valueChanges.subscribe(sync);
  }
  return group;
}

/** A task row, filled from `task` when the plan already has it. */
export function taskForm(task?: PlanTaskDto): TaskForm {
  return new FormGroup({
    id: new FormControl<number | null>(task?.id ?? null),
    title: text(task?.title ?? '', [requiredTrimmed, Validators.maxLength(200)]),
    ownerId: new FormControl<number | null>(task?.owner?.id ?? null),
    dueDate: new FormControl<Date | null>(fromIsoDate(task?.dueDate)),
  });
}

/** An empty plan editor form, or one filled from an existing plan. */
export function planForm(plan?: PlanDto): PlanForm {
  return new FormGroup({
    strategy: new FormControl<PlanStrategy | null>(plan?.strategy ?? null, Validators.required),
    description: text(plan?.description ?? '', [requiredTrimmed, Validators.maxLength(10_000)]),
    estimatedCost: new FormControl<number | null>(plan?.estimatedCost ?? null,
      [Validators.min(0), Validators.max(1e12)]),
    targetDate: new FormControl<Date | null>(fromIsoDate(plan?.targetDate)),
    changes: new FormArray((plan?.changes ?? []).map((change) => changeForm(change.kind, change))),
    tasks: new FormArray((plan?.tasks ?? []).map((task) => taskForm(task))),
  });
}

/** A change row as the API's PlanChange. */
export function changeValue(row: ChangeForm): PlanChange {
  const value = row.getRawValue();
  switch (value.kind) {
    case 'add_source':
      return {
        kind: 'add_source',
        itemCode: value.itemCode.trim(),
        supplierCode: value.supplierCode.trim(),
        buyerCode: value.isEveryBuyer ? null : value.buyerCode.trim(),
      };
    case 'raise_cover':
      return {
        kind: 'raise_cover',
        plantCode: value.plantCode.trim(),
        itemCode: value.itemCode.trim(),
        weeksOfCover: Number(value.weeks),
      };
    case 'set_recovery':
      return {
        kind: 'set_recovery',
        supplierCode: value.supplierCode.trim(),
        recoveryWeeks: Number(value.weeks),
      };
  }
}

/** A task row as the API's task input. */
export function taskValue(row: TaskForm): CreatePlanInput['tasks'][number] {
  const value = row.getRawValue();
  return { title: value.title.trim(), ownerId: value.ownerId, dueDate: toIsoDate(value.dueDate) };
}

/** The form as POST /api/register/:entryId/plans wants it (the form must be valid). */
export function createPlanValue(form: PlanForm): CreatePlanInput {
  const value = form.getRawValue();
  return {
    strategy: value.strategy!,
    description: value.description.trim(),
    estimatedCost: value.estimatedCost === null ? null : Number(value.estimatedCost),
    targetDate: toIsoDate(value.targetDate),
    changes: form.controls.changes.controls.map(changeValue),
    tasks: form.controls.tasks.controls.map(taskValue),
  };
}

// The API names a field by its path in the request; the editor's controls differ in places.
const FIELD_ALIASES: Readonly<Record<string, string>> = {
  weeksOfCover: 'weeks',
  recoveryWeeks: 'weeks',
};

/** A field path of the API (`body.changes.0.itemCode`, `changes[0].itemCode`) as form path. */
export function formPathOf(apiPath: string): string[] {
  const parts = apiPath.replace(/\[(\d+)\]/g, '.$1').split('.').filter((part) => part !== '');
  if (parts[0] === 'body') parts.shift();
  const last = parts.length - 1;
  if (last >= 0) parts[last] = FIELD_ALIASES[parts[last]!] ?? parts[last]!;
  return parts;
}

/** One located problem from a 400 answer. */
export interface FieldIssue {
  readonly path: string;
  readonly message: string;
}

/** The located problems of an API error body (`details.issues`, or a "path: message" text). */
export function fieldIssues(body: unknown): FieldIssue[] {
  const error = (body as { error?: { message?: unknown; details?: unknown } } | null)?.error;
  const issues = (error?.details as { issues?: unknown } | undefined)?.issues;
  if (Array.isArray(issues)) {
    return issues.filter((issue): issue is FieldIssue =>
      typeof issue?.path === 'string' && typeof issue?.message === 'string');
  }
  const message = typeof error?.message === 'string' ? error.message : '';
  const match = /(body\.[\w.[\]]+):\s*(.+)$/.exec(message);
  return match ? [{ path: match[1]!, message: match[2]! }] : [];
}

/**
 * Puts each issue on the control it names as a `server` error (shown under that field; cleared
 * as soon as the value changes). Returns the issues no control matched, for the banner.
 */
export function applyServerErrors(form: AbstractControl, issues: FieldIssue[]): FieldIssue[] {
  const unmatched: FieldIssue[] = [];
  for (const issue of issues) {
    const control = form.get(formPathOf(issue.path));
    if (control && control !== form) {
      control.setErrors({ ...(control.errors ?? {}), server: issue.message });
      control.markAsTouched();
    } else {
      unmatched.push(issue);
    }
  }
  return unmatched;
}

import { HttpTestingController } from '@angular/common/http/testing';
import { Location } from '@angular/common';
import { TestBed } from '@angular/core/testing';
import { Router } from '@angular/router';
import { RouterTestingHarness } from '@angular/router/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { Session } from '../auth/session';
import { registerEntryDetail } from '../register/register-fixtures';
import { userWithRole } from '../testing/user-fixtures';
import { planDetail, planTask } from './plan-fixtures';
import { PlanEditorPage } from './plan-editor-page';
import {
  StubPage,
  button,
  clearOverlays,
  plansTestProviders,
  type,
  words,
} from './plan-spec-helpers';

const SELLS = ['S-1-001', 'S-1-002'].map((buyerCode) => ({
  buyerCode, buyerKind: 'supplier', buyerName: buyerCode, itemCode: 'M-01',
  supplierCode: 'S-2-SHARED-A', supplierName: 'Kestrel Forgings', sharePct: 100,
  isQualified: true, qualifiedSources: 1, row: null,
}));

const OWNERS = {
  items: [
    { id: 2, name: 'Bruno Keller', role: 'buyer' },
    { id: 3, name: 'Rania Okafor', role: 'risk_manager' },
  ],
};

describe('PlanEditorPage', () => {
  let harness: RouterTestingHarness;
  let backend: HttpTestingController;
  let root: HTMLElement;

  async function settle(): Promise<void> {
    await harness.fixture.whenStable();
    harness.detectChanges();
  }

  async function openNew(): Promise<void> {
    TestBed.inject(Session).signIn(userWithRole('risk_manager'));
    harness = await RouterTestingHarness.create('/plans/new?entry=12');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/register/owners').flush(OWNERS);
    backend.expectOne('/api/register/12').flush(registerEntryDetail(12));
    await settle();
    flushSupplier();
    await settle();
  }

  // The editor reads what the entry's supplier sells in the newest version, as a hint.
  function flushSupplier(sells = SELLS): void {
    backend.expectOne('/api/network-versions/latest').flush({ id: 3 });
    backend.expectOne('/api/network-versions/3/suppliers/S-2-SHARED-A').flush({ sells });
  }

  function field(name: string, scope: ParentNode = root): HTMLInputElement {
    return scope.querySelector<HTMLInputElement>(`[formcontrolname="${name}"]`)!;
  }

  async function choose(select: Element, label: string): Promise<void> {
    select.querySelector<HTMLElement>('.mat-mdc-select-trigger')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('mat-option')]
      .find((option) => words(option) === label)!
      .click();
    await settle();
  }

  async function addChange(label: string): Promise<HTMLElement> {
    button(root, 'Add a change')!.click();
    await settle();
    [...document.querySelectorAll<HTMLElement>('[mat-menu-item]')]
      .find((item) => words(item) === label)!
      .click();
    await settle();
    const rows = root.querySelectorAll<HTMLElement>('li.editor__row');
    return rows[rows.length - 1]!;
  }

  function errorsOf(scope: ParentNode): string[] {
    return [...scope.querySelectorAll('mat-error')].map(words);
  }

  beforeEach(() => {
    TestBed.configureTestingModule({
      providers: plansTestProviders([
        { path: 'plans/new', component: PlanEditorPage },
        { path: 'plans/:id/edit', component: PlanEditorPage },
        { path: 'plans/:id', component: StubPage },
      ]),
    });
    backend = TestBed.inject(HttpTestingController);
  });

  afterEach(() => {
    backend.verify();
    clearOverlays();
  });

  it('says what is missing under each field and sends nothing', async () => {
    await openNew();
    expect(words(root)).toContain('No. 12 Single source for cast housings (12)');
    const change = await addChange('Raise weeks of cover');
    button(root, 'Save draft')!.click();
    await settle();
    expect(errorsOf(root.querySelector('form')!)).toEqual([
      'Choose a strategy.',
      'Describe the plan.',
      'Name the plant.',
      'Name the item.',
      'Enter the weeks.',
    ]);
    type(field('weeks', change), '600');
    await settle();
    expect(errorsOf(change)).toContain('Between 0 and 520 weeks.');
    expect(words(root.querySelector('[role="alert"]'))).toContain('Some fields need a look');
  });

  it('posts a new draft with its changes and tasks, then opens the plan', async () => {
    await openNew();
    await choose(field('strategy'), 'Second source');
    type(field('description') as unknown as HTMLTextAreaElement, 'Qualify a second caster.');
    type(field('estimatedCost'), '45000');
    type(field('targetDate'), '3/31/2027');
    const change = await addChange('Add a qualified source');
    // The supplier sells one item: it is filled in, and the hint says to whom.
    expect(field('itemCode', change).value).toBe('M-01');
    expect(words(change.querySelector('mat-hint'))).toBe('S-2-SHARED-A supplies M-01 to 2 buyers.');
    type(field('itemCode', change), 'I-CAST-1');
    type(field('supplierCode', change), 'S-2-ALT');
    expect(field('buyerCode', change)).toBeNull();
    button(root, 'Add a task')!.click();
    await settle();
    const task = root.querySelector<HTMLElement>('li.editor__task')!;
    type(field('title', task), 'Audit the second caster');
    await choose(field('ownerId', task), 'Bruno Keller');
    type(field('dueDate', task), '1/15/2027');
    button(root, 'Save draft')!.click();
    await settle();
    const post = backend.expectOne('/api/register/12/plans');
    expect(post.request.method).toBe('POST');
    expect(post.request.headers.get('x-keelson-csrf')).toBe('1');
    expect(post.request.body).toEqual({
      strategy: 'second_source',
      description: 'Qualify a second caster.',
      estimatedCost: 45000,
      targetDate: '2027-03-31',
      changes: [
        { kind: 'add_source', itemCode: 'I-CAST-1', supplierCode: 'S-2-ALT', buyerCode: null },
      ],
      tasks: [{ title: 'Audit the second caster', ownerId: 2, dueDate: '2027-01-15' }],
    });
    post.flush(planDetail(7));
    await settle();
    expect(TestBed.inject(Router).url).toBe('/plans/7');
  });

  it('names a buyer when "every buyer" is unticked', async () => {
    await openNew();
    const change = await addChange('Add a qualified source');
    change.querySelector<HTMLInputElement>('input[type="checkbox"]')!.click();
    await settle();
    button(root, 'Save draft')!.click();
    await settle();
    expect(errorsOf(change)).toContain('Name the buyer, or tick "every buyer".');
  });

  it('shows the server\'s field error under the field it names', async () => {
    await openNew();
    await choose(field('strategy'), 'Safety stock');
    type(field('description') as unknown as HTMLTextAreaElement, 'Hold twelve weeks.');
    const change = await addChange('Raise weeks of cover');
    type(field('plantCode', change), 'P-NORTH');
    type(field('itemCode', change), 'I-NOPE');
    type(field('weeks', change), '12');
    button(root, 'Save draft')!.click();
    await settle();
    backend.expectOne('/api/register/12/plans').flush({
      error: {
        code: 'invalid_request',
        message: 'The request is not valid: body.changes.0.itemCode: no item I-NOPE',
        details: { issues: [{ path: 'body.changes.0.itemCode', message: 'no item I-NOPE' }] },
      },
    }, { status: 400, statusText: 'Bad Request' });
    await settle();
    expect(errorsOf(change)).toEqual(['no item I-NOPE']);
    expect(words(root.querySelector('[role="alert"]'))).toContain('did not accept some fields');
    expect(TestBed.inject(Router).url).toBe('/plans/new?entry=12');
  });

  it('saves, runs the what-if and shows its refusal under the change it names', async () => {
    await openNew();
    await choose(field('strategy'), 'Second source');
    type(field('description') as unknown as HTMLTextAreaElement, 'Qualify a second caster.');
    const change = await addChange('Add a qualified source');
    type(field('supplierCode', change), 'S-2-NOPE');
    button(root, 'Save and run what-if')!.click();
    await settle();
    const created = planDetail(7, {
      changes: [{ kind: 'add_source', itemCode: 'M-01', supplierCode: 'S-2-NOPE',
        buyerCode: null }],
      tasks: [],
      can: { edit: true, submit: true, withdraw: true, decideFor: [] },
    });
    backend.expectOne('/api/register/12/plans').flush(created);
    await settle();
    const message = 'the network has no supplier S-2-NOPE; describe it in newSupplier to add it';
    const path = 'body.changes[0].supplierCode';
    backend.expectOne('/api/plans/7/what-if').flush(
      { error: { code: 'invalid_request', message: `${path}: ${message}`,
        details: { issues: [{ path, message }] } } },
      { status: 400, statusText: 'Bad Request' });
    await settle();
    backend.expectOne('/api/plans/7').flush(created);
    await settle();
    const row = root.querySelector<HTMLElement>('li.editor__row')!;
    expect(errorsOf(row)).toEqual([message]);
    expect(words(root.querySelector('[role="alert"]'))).toContain('The draft is saved');
    expect(TestBed.inject(Location).path()).toBe('/plans/7/edit');
    // Saving again edits the saved draft instead of making a second one.
    type(field('supplierCode', row), 'S-2-011');
    button(root, 'Save draft')!.click();
    await settle();
    const patch = backend.expectOne('/api/plans/7');
    expect(patch.request.method).toBe('PATCH');
    patch.flush(created);
    await settle();
  });

  it('edits a returned draft: PATCH for the plan, DELETE and POST for its tasks', async () => {
    TestBed.inject(Session).signIn(userWithRole('risk_manager'));
    harness = await RouterTestingHarness.create('/plans/7/edit');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/register/owners').flush(OWNERS);
    backend.expectOne('/api/plans/7').flush(planDetail(7, {
      rejectionComment: 'Name the caster and its audit date.',
      tasks: [planTask(31), planTask(32, { title: 'Sign the frame contract' })],
      can: { edit: true, submit: true, withdraw: true, decideFor: [] },
    }));
    await settle();
    flushSupplier([]);
    await settle();
    expect(words(root.querySelector('[role="note"]'))).toContain(
      'Name the caster and its audit date.');
    expect(field('itemCode', root.querySelector('li.editor__row')!).value).toBe('I-CAST-1');
    root.querySelector<HTMLElement>('[aria-label="Remove task 1"]')!.click();
    await settle();
    button(root, 'Add a task')!.click();
    await settle();
    const rows = root.querySelectorAll<HTMLElement>('li.editor__task');
    expect(rows.length).toBe(2);
    type(field('title', rows[1]!), 'Audit the caster on 2027-01-10');
    type(field('description') as unknown as HTMLTextAreaElement, 'Qualify S-2-ALT by March.');
    button(root, 'Save draft')!.click();
    await settle();
    const patch = backend.expectOne('/api/plans/7');
    expect(patch.request.method).toBe('PATCH');
    expect(patch.request.body).toMatchObject({
      description: 'Qualify S-2-ALT by March.',
      changes: [
        { kind: 'add_source', itemCode: 'I-CAST-1', supplierCode: 'S-2-ALT', buyerCode: null },
      ],
    });
    patch.flush(planDetail(7));
    await settle();
    const remove = backend.expectOne('/api/tasks/31');
    expect(remove.request.method).toBe('DELETE');
    remove.flush(null);
    await settle();
    const add = backend.expectOne('/api/plans/7/tasks');
    expect(add.request.body).toEqual({
      title: 'Audit the caster on 2027-01-10',
      ownerId: null,
      dueDate: null,
    });
    add.flush(planTask(33));
    await settle();
    expect(TestBed.inject(Router).url).toBe('/plans/7');
  });

  it('locks the form of a plan that can no longer be edited', async () => {
    TestBed.inject(Session).signIn(userWithRole('risk_manager'));
    harness = await RouterTestingHarness.create('/plans/7/edit');
    root = harness.routeNativeElement!;
    await settle();
    backend.expectOne('/api/register/owners').flush(OWNERS);
    backend.expectOne('/api/plans/7').flush(planDetail(7, { status: 'submitted' }));
    await settle();
    flushSupplier([]);
    await settle();
    expect(words(root.querySelector('[role="alert"]'))).toContain('can no longer be edited');
    expect((button(root, 'Save draft') as HTMLButtonElement).disabled).toBe(true);
    expect(button(root, 'Add a task')).toBeUndefined();
  });
});

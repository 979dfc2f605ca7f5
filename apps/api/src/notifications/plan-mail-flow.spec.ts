import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { PlanDto } from '@keelson/contracts';
import { createPlanTestApp, SECOND_SOURCE, type PlanTestApp } from '../plans/plan-test-setup';
import { caughtMail, clearMail } from './notification-fixtures';

// The whole path through the real app: the plans API commits and calls the listener that
// app.ts wired in; the messages arrive in the sink in the background, so the spec waits for
// them to be stored (vi.waitFor polls; it asserts content, not time).
let s: PlanTestApp;
beforeAll(async () => {
  s = await createPlanTestApp();
});
afterAll(() => s.t.close());

const subjectsTo = () => caughtMail(s.t.database.db)
  .map((message) => `${message.toAddresses.join(',')}: ${message.subject}`).sort();
const waitForMail = (count: number) => vi.waitFor(
  () => expect(caughtMail(s.t.database.db)).toHaveLength(count), { timeout: 10_000 });

describe('e-mails of a plan through the plans API', () => {
  it('mails the approvers on submit, the author on each decision, the assignee on approval',
    async () => {
      const buyer = s.t.userId('buyer@demo.test');
      const draft = await s.draft('S-2-SHARED-A', { changes: SECOND_SOURCE,
        tasks: [{ title: 'Send the drawing pack', ownerId: buyer, dueDate: '2026-03-20' }] });
      expect((await s.post('risk', `/api/plans/${draft.id}/what-if`)).status).toBe(200);
      clearMail(s.t.database.db);

      expect((await s.post('risk', `/api/plans/${draft.id}/submit`)).status).toBe(200);
      await waitForMail(2);
      const entry = (await s.get('risk', `/api/plans/${draft.id}`)).body as PlanDto;
      const title = entry.entry.title;
      expect(subjectsTo()).toEqual([
        `plant.north@demo.test: Plan waiting for your approval (P-NORTH): ${title}`,
        `plant.south@demo.test: Plan waiting for your approval (P-SOUTH): ${title}`,
      ]);
      const toNorth = caughtMail(s.t.database.db)
        .find((message) => message.toAddresses[0] === 'plant.north@demo.test')!;
      expect(toNorth.text).toContain(`${s.t.config.publicUrl}/plans/${draft.id}`);
      expect(toNorth.text).toContain('not a single point of failure after');

      clearMail(s.t.database.db);
      expect((await s.post('north', `/api/plans/${draft.id}/decisions`,
        { plantCode: 'P-NORTH', decision: 'approved' })).status).toBe(200);
      await waitForMail(1);
      expect(subjectsTo()).toEqual([`risk@demo.test: Plan approved for P-NORTH: ${title}`]);
      expect(caughtMail(s.t.database.db)[0]!.text)
        .toContain('Plan status now: Waiting for approval: the managers of other plants');

      clearMail(s.t.database.db);
      expect((await s.post('south', `/api/plans/${draft.id}/decisions`,
        { plantCode: 'P-SOUTH', decision: 'approved', comment: 'Fine by P-SOUTH.' })).status)
        .toBe(200);
      await waitForMail(2);
      expect(subjectsTo()).toEqual([
        'buyer@demo.test: Task assigned to you: Send the drawing pack',
        `risk@demo.test: Plan approved for P-SOUTH: ${title}`,
      ]);
      const toAuthor = caughtMail(s.t.database.db)
        .find((message) => message.toAddresses[0] === 'risk@demo.test')!;
      expect(toAuthor.text).toContain('Comment: Fine by P-SOUTH.');
      expect(toAuthor.text).toContain('Plan status now: Approved');
    });
});

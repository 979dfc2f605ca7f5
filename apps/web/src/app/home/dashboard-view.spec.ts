import type { DashboardDto } from '@keelson/contracts';
import { describe, expect, it } from 'vitest';
import { NAVIGATION } from '../shell/navigation';
import { dashboardCards, type DashboardCard, type DashboardLink } from './dashboard-view';

const NONE: DashboardDto = {
  role: 'viewer', hasNetwork: true, openEntriesByBand: null, entriesByStatus: null,
  lastRun: null, lastRescoring: null, plansAwaitingApproval: null, overdueTasks: null,
  myOverdueTasks: null, topRisks: null, lastImport: null,
};
const RISK: DashboardDto = {
  ...NONE,
  role: 'risk_manager',
  openEntriesByBand: { low: 1, medium: 3, high: 2, critical: 1 },
  entriesByStatus: {
    open: { low: 1, medium: 2, high: 2, critical: 1 },
    mitigating: { low: 0, medium: 1, high: 0, critical: 0 },
  },
  lastRun: { id: 7, label: 'Spring review', finishedAt: '2026-03-01T10:00:00.000Z',
    kind: 'manual' },
  lastRescoring: { id: 3, quarterLabel: '2026-Q1', status: 'succeeded',
    finishedAt: '2026-03-01T10:00:00.000Z', summary: { rescored: 9, created: 2,
      ratingChanged: 3, supplierRemoved: 1, noLongerMatters: 0, previousRescoringId: 2,
      mailsSent: 4 } },
  plansAwaitingApproval: 5,
  overdueTasks: 3,
  myOverdueTasks: 1,
};

const cardOf = (cards: DashboardCard[], id: DashboardCard['id']) =>
  cards.find((card) => card.id === id)!;
const url = (link: DashboardLink) =>
  link.path + (link.query ? `?${new URLSearchParams(link.query as Record<string, string>)}` : '');
/** Every link of a card: its figures, band cells, risks, empty-state action and closing link. */
const linksOf = (card: DashboardCard): DashboardLink[] => [
  ...card.figures.map((figure) => figure.link),
  ...(card.bands ?? []).flatMap((row) => [row.open.link, row.mitigating.link]),
  ...(card.risks ?? []).map((risk) => risk.link),
  ...(card.empty?.action ? [card.empty.action] : []),
  ...(card.more ? [card.more] : []),
  ...(card.also ? [card.also] : []),
];

describe('dashboardCards', () => {
  it('puts e-mail the mail server refused first for an administrator, linked to Sent mail',
    () => {
      const cards = dashboardCards({ ...RISK, unsentMail: { pending: 2, failed: 1 } }, 'admin');
      expect(cards[0]!.id).toBe('mail');
      expect(cards[0]!.figures.map((f) => [f.value, f.label, url(f.link)])).toEqual([
        [2, 'e-mails waiting to be tried again', '/admin/mail'],
        [1, 'e-mail given up', '/admin/mail']]);
      expect(dashboardCards({ ...RISK, unsentMail: { pending: 0, failed: 0 } }, 'admin')
        .map((card) => card.id)).not.toContain('mail');
    });

  it('gives a risk manager the register, approvals, tasks, the last run and re-scoring', () => {
    const cards = dashboardCards(RISK, 'risk_manager');
    expect(cards.map((card) => card.id))
      .toEqual(['register', 'approvals', 'tasks', 'run', 'rescoring']);
    const register = cardOf(cards, 'register');
    expect(register.figures.map((figure) => [figure.value, url(figure.link)])).toEqual([
      [6, '/register?status=open'], [1, '/register?status=mitigating']]);
    expect(register.bands!.map((row) => [row.band, row.open.value, url(row.open.link),
      row.mitigating.value, url(row.mitigating.link)])).toEqual([
      ['critical', 1, '/register?ratingBand=critical&status=open', 0,
        '/register?ratingBand=critical&status=mitigating'],
      ['high', 2, '/register?ratingBand=high&status=open', 0,
        '/register?ratingBand=high&status=mitigating'],
      ['medium', 2, '/register?ratingBand=medium&status=open', 1,
        '/register?ratingBand=medium&status=mitigating'],
      ['low', 1, '/register?ratingBand=low&status=open', 0,
        '/register?ratingBand=low&status=mitigating'],
    ]);
    expect(cardOf(cards, 'approvals').figures.map((f) => [f.value, f.label, url(f.link)]))
      .toEqual([[5, 'plans waiting for approval', '/approvals']]);
    expect(cardOf(cards, 'tasks').figures.map((f) => [f.value, url(f.link)]))
      .toEqual([[3, '/tasks?whose=everyone&show=overdue'], [1, '/tasks?show=overdue']]);
    expect(cardOf(cards, 'run').figures.map((f) => [f.value, url(f.link)]))
      .toEqual([['Spring review', '/runs/7']]);
    const rescoring = cardOf(cards, 'rescoring');
    expect(rescoring.figures.map((f) => [f.value, f.label, url(f.link)])).toEqual([
      ['2026-Q1', 'finished', '/rescoring'],
      [3, 'ratings changed', '/rescoring/compare'],
      [2, 'new entries', '/rescoring/compare'],
      [1, 'suppliers removed', '/rescoring/compare'],
      [0, 'no longer matter', '/rescoring/compare'],
    ]);
    expect(rescoring.more?.label).toBe('See what changed');
  });

  it('gives a plant manager their top risks, their approvals and their tasks', () => {
    const dto: DashboardDto = { ...NONE, role: 'plant_manager',
      openEntriesByBand: RISK.openEntriesByBand, entriesByStatus: RISK.entriesByStatus,
      topRisks: [{ id: 12, title: 'Single source for castings', supplierCode: 'S-2-SHARED-A',
        rating: 12, ratingBand: 'high', plants: ['P-NORTH', 'P-SOUTH'] }],
      plansAwaitingApproval: 1, overdueTasks: 0 };
    const cards = dashboardCards(dto, 'plant_manager');
    expect(cards.map((card) => card.id)).toEqual(['risks', 'approvals', 'register', 'tasks']);
    expect(cardOf(cards, 'register').title).toBe('Open risks at your plants');
    const risks = cardOf(cards, 'risks').risks!;
    expect(risks.map((risk) => [risk.title, risk.plants, url(risk.link)]))
      .toEqual([['Single source for castings', 'P-NORTH, P-SOUTH', '/register/12']]);
    expect(cardOf(cards, 'approvals').figures[0]!.label).toBe('plan waiting for you');
    expect(cardOf(cards, 'tasks').empty?.text).toBe('Nothing is overdue.');
  });

  it('gives a buyer the last import with its warnings and errors, each opening the batch', () => {
    const dto: DashboardDto = { ...NONE, role: 'buyer', lastImport: { id: 4,
      fileName: 'suppliers.xlsx', status: 'committed', warningCount: 2, errorCount: 0,
      createdAt: '2026-03-02T09:00:00.000Z' } };
    const cards = dashboardCards(dto, 'buyer');
    expect(cards.map((card) => card.id)).toEqual(['import']);
    expect(cards[0]!.figures.map((f) => [f.value, f.label, url(f.link)])).toEqual([
      ['suppliers.xlsx', 'imported', '/imports/4'], [2, 'warnings', '/imports/4'],
      [0, 'errors', '/imports/4']]);
    expect([cards[0]!.more?.path, cards[0]!.also?.path]).toEqual(['/imports', '/imports/history']);
  });

  it('says what to do first in an empty workspace, per role', () => {
    const empty: DashboardDto = { ...NONE, hasNetwork: false,
      openEntriesByBand: { low: 0, medium: 0, high: 0, critical: 0 } };
    const buyer = dashboardCards({ ...NONE, hasNetwork: false }, 'buyer');
    expect(cardOf(buyer, 'network').empty).toEqual({
      text: 'Import the supplier spreadsheet first.',
      action: { path: '/imports', label: 'Import the supplier spreadsheet' } });
    expect(cardOf(buyer, 'import').empty?.action?.path).toBe('/imports');
    const viewer = dashboardCards(empty, 'viewer');
    expect(cardOf(viewer, 'network').empty).toEqual({
      text: 'Nothing to count yet: ask a buyer to import the supplier spreadsheet.' });
    expect(cardOf(viewer, 'run').empty?.text).toBe('A run needs an imported network first.');
    const risk = dashboardCards({ ...empty, hasNetwork: true, plansAwaitingApproval: 0,
      overdueTasks: 0 }, 'risk_manager');
    expect(cardOf(risk, 'run').empty?.action).toEqual({ path: '/runs',
      label: 'Start an analysis run' });
    expect(cardOf(risk, 'register').empty?.text).toContain('An analysis run adds entries');
    expect(cardOf(risk, 'rescoring').empty?.action?.path).toBe('/rescoring');
  });

  it('links only to pages the role can open', () => {
    const everything: DashboardDto = { ...RISK, hasNetwork: false,
      topRisks: [{ id: 1, title: 'A risk', supplierCode: 'S-1', rating: 4, ratingBand: 'low' }],
      lastImport: { id: 2, fileName: 'a.xlsx', status: 'ready', warningCount: 0, errorCount: 0,
        createdAt: '2026-03-02T09:00:00.000Z' } };
    for (const role of ['admin', 'buyer', 'risk_manager', 'plant_manager', 'viewer'] as const) {
      for (const link of dashboardCards(everything, role).flatMap(linksOf)) {
        const entry = NAVIGATION.filter((candidate) => link.path === `/${candidate.path}`
          || link.path.startsWith(`/${candidate.path}/`))
          .sort((a, b) => b.path.length - a.path.length)[0];
        expect(entry, `${role}: ${link.path}`).toBeDefined();
        expect((entry!.roles as readonly string[]).includes(role), `${role}: ${link.path}`)
          .toBe(true);
      }
    }
  });
});

/**
 * The home dashboard's cards, worked out from the API's figures and the role: what each card
 * says, every figure with the link to the list behind it, and what to do first when there is
 * nothing to count yet. Pure, so the rules are tested without rendering.
 */
import type { DashboardDto, RatingBand, Role } from '@keelson/contracts';

/** Where a figure leads: a route path and its query parameters. */
export interface DashboardLink {
  readonly path: string;
  readonly query?: Readonly<Record<string, string>>;
}

/** One figure on a card: a number (or a short value), what it counts, and its list. */
export interface DashboardFigure {
  readonly value: number | string;
  readonly label: string;
  readonly link: DashboardLink;
}

/** One band's row of the register card: open and mitigating entries, each a link. */
export interface BandRow {
  readonly band: RatingBand;
  readonly open: DashboardFigure;
  readonly mitigating: DashboardFigure;
}

/** One of a plant manager's top risks. */
export interface RiskRow {
  readonly id: number;
  readonly title: string;
  readonly supplierCode: string;
  readonly rating: number;
  readonly band: RatingBand;
  readonly plants: string;
  readonly link: DashboardLink;
}

/** What a card says when there is nothing to count, and where to go first. */
export interface EmptyState {
  readonly text: string;
  readonly action?: DashboardLink & { readonly label: string };
}

/** One card of the dashboard. */
export interface DashboardCard {
  readonly id: 'network' | 'register' | 'run' | 'rescoring' | 'approvals' | 'tasks' | 'risks'
    | 'import' | 'mail';
  readonly icon: string;
  readonly title: string;
  /** What the figures are, in one sentence. */
  readonly note: string;
  /** A date shown under the title (the run's or import's), ISO. */
  readonly date?: string | null;
  readonly figures: readonly DashboardFigure[];
  readonly bands?: readonly BandRow[];
  readonly risks?: readonly RiskRow[];
  readonly empty?: EmptyState;
  /** A closing link ("All entries"). */
  readonly more?: DashboardLink & { readonly label: string };
  /** A second closing link, after {@link more}. */
  readonly also?: DashboardLink & { readonly label: string };
}

/** Highest band first: the order a reader scans a register. */
const BANDS_WORST_FIRST: readonly RatingBand[] = ['critical', 'high', 'medium', 'low'];
const BAND_NAMES: Readonly<Record<RatingBand, string>> = {
  low: 'Low', medium: 'Medium', high: 'High', critical: 'Critical',
};
const IMPORTERS: readonly Role[] = ['buyer', 'admin'];
const RUNNERS: readonly Role[] = ['risk_manager', 'admin'];
// The roles of the Approvals page.
const DECIDERS: readonly Role[] = ['plant_manager', 'risk_manager', 'admin'];

const plural = (count: number, one: string, many = `${one}s`) => (count === 1 ? one : many);

/**
 * The cards for a dashboard answer, in reading order: what to do first, then the role's main
 * work (a plant manager's top risks and decisions; everyone else's register), then the rest.
 */
export function dashboardCards(dto: DashboardDto, role: Role): DashboardCard[] {
  const cards: DashboardCard[] = [];
  // E-mail the mail server refused first: owners are not being told what changed.
  const unsent = dto.unsentMail;
  if (unsent && unsent.pending + unsent.failed > 0) cards.push(mailCard(unsent));
  if (!dto.hasNetwork) cards.push(networkCard(role));
  const register = dto.openEntriesByBand ? registerCard(dto, role) : null;
  const approvals = dto.plansAwaitingApproval !== null && DECIDERS.includes(role)
    ? approvalsCard(dto.plansAwaitingApproval, role) : null;
  if (dto.topRisks) {
    // Wide and narrow cards alternate, so the grid's rows fill.
    cards.push(risksCard(dto.topRisks), ...present(approvals, register));
  } else {
    cards.push(...present(register, approvals));
  }
  if (dto.overdueTasks !== null) cards.push(tasksCard(dto, role));
  if (role !== 'buyer' && role !== 'plant_manager') cards.push(runCard(dto, role));
  if (RUNNERS.includes(role)) cards.push(rescoringCard(dto));
  if (IMPORTERS.includes(role)) cards.push(importCard(dto));
  return cards;
}

const present = (...cards: (DashboardCard | null)[]): DashboardCard[] =>
  cards.filter((card): card is DashboardCard => card !== null);

function mailCard(unsent: { pending: number; failed: number }): DashboardCard {
  const link: DashboardLink = { path: '/admin/mail' };
  return {
    id: 'mail', icon: 'schedule_send', title: 'E-mail not sent yet',
    note: 'Notification e-mails the mail server did not take: waiting ones are tried again ' +
      'on their own; given-up ones go out when you send them again from Sent mail.',
    figures: [
      ...(unsent.pending > 0 ? [{ value: unsent.pending,
        label: `${plural(unsent.pending, 'e-mail')} waiting to be tried again`, link }] : []),
      ...(unsent.failed > 0 ? [{ value: unsent.failed,
        label: `${plural(unsent.failed, 'e-mail')} given up`, link }] : []),
    ],
    more: { ...link, label: 'See them and send them now' },
  };
}

function networkCard(role: Role): DashboardCard {
  const imports = IMPORTERS.includes(role);
  return {
    id: 'network', icon: 'upload_file', title: 'No supplier network yet',
    note: 'Every figure here comes from the supplier network: its suppliers, parts and plants.',
    figures: [],
    empty: imports
      ? { text: 'Import the supplier spreadsheet first.',
        action: { path: '/imports', label: 'Import the supplier spreadsheet' } }
      : { text: 'Nothing to count yet: ask a buyer to import the supplier spreadsheet.' },
  };
}

function registerCard(dto: DashboardDto, role: Role): DashboardCard {
  const total = dto.openEntriesByBand!;
  // Older servers answer only the totals: count them all as open.
  const byStatus = dto.entriesByStatus ?? { open: total,
    mitigating: { low: 0, medium: 0, high: 0, critical: 0 } };
  const figure = (status: 'open' | 'mitigating', band: RatingBand): DashboardFigure => ({
    value: byStatus[status][band],
    label: `${BAND_NAMES[band]}, ${status}`,
    link: { path: '/register', query: { ratingBand: band, status } },
  });
  const sum = (status: 'open' | 'mitigating') =>
    Object.values(byStatus[status]).reduce((a, b) => a + b, 0);
  const open = sum('open');
  const mitigating = sum('mitigating');
  const mine = role === 'plant_manager' ? ' at your plants' : '';
  return {
    id: 'register', icon: 'fact_check', title: `Open risks${mine}`,
    note: 'Register entries still open or being mitigated, by rating band (impact x ' +
      'likelihood); accepted and closed entries are not counted.',
    figures: [
      { value: open, label: `open ${plural(open, 'entry', 'entries')}`,
        link: { path: '/register', query: { status: 'open' } } },
      { value: mitigating, label: 'being mitigated',
        link: { path: '/register', query: { status: 'mitigating' } } },
    ],
    bands: BANDS_WORST_FIRST.map((band) => ({ band, open: figure('open', band),
      mitigating: figure('mitigating', band) })),
    empty: open + mitigating === 0
      ? { text: dto.hasNetwork
        ? 'No open entries. An analysis run adds entries for the suppliers it scores.'
        : 'The register fills after the network is imported and analysed.' }
      : undefined,
    more: { path: '/register', label: 'Open the register' },
  };
}

function risksCard(risks: NonNullable<DashboardDto['topRisks']>): DashboardCard {
  return {
    id: 'risks', icon: 'factory', title: 'Top risks at your plants',
    note: 'The highest-rated open entries that affect one of your plants.',
    figures: [],
    risks: risks.map((risk) => ({ id: risk.id, title: risk.title,
      supplierCode: risk.supplierCode, rating: risk.rating, band: risk.ratingBand,
      plants: (risk.plants ?? []).join(', '), link: { path: `/register/${risk.id}` } })),
    empty: risks.length === 0
      ? { text: 'No open risk affects your plants at the moment.' } : undefined,
    more: { path: '/register', label: 'All entries for your plants' },
  };
}

function approvalsCard(count: number, role: Role): DashboardCard {
  const yours = role === 'plant_manager';
  return {
    id: 'approvals', icon: 'approval', title: yours ? 'Waiting for your decision' : 'Approvals',
    note: yours
      ? 'Submitted plans for risks at your plants that your plant has not decided on yet.'
      : 'Mitigation plans submitted and waiting for the plant managers\u2019 decisions.',
    figures: [{ value: count, label: `${plural(count, 'plan')} waiting for ` +
      (yours ? 'you' : 'approval'), link: { path: '/approvals' } }],
    empty: count === 0 ? { text: yours ? 'Nothing is waiting for you.'
      : 'No plan is waiting for approval.' } : undefined,
  };
}

function tasksCard(dto: DashboardDto, role: Role): DashboardCard {
  const count = dto.overdueTasks!;
  const all = RUNNERS.includes(role);
  const figures: DashboardFigure[] = [{ value: count,
    label: all ? `overdue ${plural(count, 'task')} on all plans` : `of your tasks overdue`,
    link: { path: '/tasks', query: all ? { whose: 'everyone', show: 'overdue' }
      : { show: 'overdue' } } }];
  if (all && dto.myOverdueTasks !== undefined && dto.myOverdueTasks !== null) {
    figures.push({ value: dto.myOverdueTasks, label: 'of them yours',
      link: { path: '/tasks', query: { show: 'overdue' } } });
  }
  return {
    id: 'tasks', icon: 'task_alt', title: 'Overdue tasks',
    note: 'Tasks to do or under way whose due date has passed (UTC), on approved plans.' +
      (all ? ' The figures open the overdue tasks of everyone and your own.' : ''),
    figures,
    empty: count === 0 ? { text: 'Nothing is overdue.' } : undefined,
  };
}

function runCard(dto: DashboardDto, role: Role): DashboardCard {
  const run = dto.lastRun;
  const runner = RUNNERS.includes(role);
  let empty: EmptyState | undefined;
  if (!run) {
    if (!dto.hasNetwork) empty = { text: 'A run needs an imported network first.' };
    else if (runner) {
      empty = { text: 'No analysis run yet. Start an analysis run to rank the suppliers and ' +
        'fill the register.', action: { path: '/runs', label: 'Start an analysis run' } };
    } else empty = { text: 'No analysis run yet: a risk manager starts one.' };
  }
  return {
    id: 'run', icon: 'insights', title: 'Last analysis run',
    note: 'The latest run that finished; the register\u2019s scores come from it.',
    date: run?.finishedAt ?? null,
    figures: run ? [{ value: run.label, label: run.kind === 'quarterly'
      ? 'quarterly re-scoring run' : 'analysis run', link: { path: `/runs/${run.id}` } }] : [],
    empty,
    more: run ? { path: '/runs', label: 'All runs' } : undefined,
  };
}

function rescoringCard(dto: DashboardDto): DashboardCard {
  const last = dto.lastRescoring;
  const compare: DashboardLink = { path: '/rescoring/compare' };
  const figures: DashboardFigure[] = [];
  if (last) {
    figures.push({ value: last.quarterLabel, label: statusWords(last.status),
      link: { path: '/rescoring' } });
    const summary = last.summary;
    if (summary) {
      figures.push(
        { value: summary.ratingChanged, label: `${plural(summary.ratingChanged, 'rating')} ` +
          'changed', link: compare },
        { value: summary.created, label: `new ${plural(summary.created, 'entry', 'entries')}`,
          link: compare },
        { value: summary.supplierRemoved, label: 'suppliers removed',
          link: compare },
        { value: summary.noLongerMatters, label: 'no longer matter', link: compare },
      );
    }
  }
  return {
    id: 'rescoring', icon: 'event_repeat', title: 'Last quarterly re-scoring',
    note: 'What the quarter\u2019s re-scoring changed in the register, against the one before.',
    date: last?.finishedAt ?? null,
    figures,
    empty: last ? undefined : { text: 'No quarterly re-scoring yet.',
      action: { path: '/rescoring', label: 'Open the quarterly re-scoring' } },
    more: last?.summary ? { ...compare, label: 'See what changed' } : undefined,
  };
}

function importCard(dto: DashboardDto): DashboardCard {
  const batch = dto.lastImport;
  const link: DashboardLink | null = batch ? { path: `/imports/${batch.id}` } : null;
  return {
    id: 'import', icon: 'upload_file', title: 'Last import',
    note: 'The latest spreadsheet uploaded, with the problems its check found.',
    date: batch?.createdAt ?? null,
    figures: batch && link ? [
      { value: batch.fileName, label: IMPORT_STATUS_WORDS[batch.status] ?? batch.status, link },
      { value: batch.warningCount, label: plural(batch.warningCount, 'warning'), link },
      { value: batch.errorCount, label: plural(batch.errorCount, 'error'), link },
    ] : [],
    empty: batch ? undefined : { text: 'No import yet. Import the supplier spreadsheet first.',
      action: { path: '/imports', label: 'Import the supplier spreadsheet' } },
    more: batch ? { path: '/imports', label: 'Import a new spreadsheet' } : undefined,
    also: batch ? { path: '/imports/history', label: 'Import history' } : undefined,
  };
}

const IMPORT_STATUS_WORDS: Readonly<Record<string, string>> = {
  needs_mapping: 'waiting for its columns to be mapped',
  rejected: 'not imported: fix the errors and upload again',
  ready: 'checked, waiting to be committed',
  committed: 'imported',
};

function statusWords(status: string): string {
  const words: Record<string, string> = {
    queued: 'waiting to start', running: 'running now', succeeded: 'finished',
    failed: 'failed', interrupted: 'interrupted: resume or restart it', cancelled: 'cancelled',
  };
  return words[status] ?? status;
}

/**
 * The quarterly re-scoring: the whole supply base re-analysed against a network version, every
 * register entry re-scored, new single points of failure given entries and entries whose
 * supplier is gone or no longer matters flagged; once per quarter label unless an admin forces
 * another. Also the comparison between two runs, the quarterly trends and the home dashboard.
 */
import { z } from 'zod';
import type { RatingBand } from './runs';
import type { RegisterFlag } from './register';

/**
 * The calendar quarter of `date` in the IANA `timeZone`, as a re-scoring is labelled: `2027-Q1`.
 * The one definition the server (the scheduled run, the default of a started one) and the web
 * (the start dialog's default) share. Throws a RangeError for a zone the runtime does not know.
 */
export function quarterLabelOf(date: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat('en-GB', { timeZone, year: 'numeric', month: 'numeric' })
    .formatToParts(date);
  const year = Number(parts.find((part) => part.type === 'year')!.value);
  const month = Number(parts.find((part) => part.type === 'month')!.value);
  return `${year}-Q${Math.floor((month - 1) / 3) + 1}`;
}

/** Where a re-scoring stands. `interrupted`: the server stopped during it; resume or restart. */
export const RESCORING_STATUSES = ['queued', 'running', 'succeeded', 'failed', 'interrupted',
  'cancelled'] as const;
/** One of {@link RESCORING_STATUSES}. */
export type RescoringStatus = (typeof RESCORING_STATUSES)[number];

/** What a re-scoring changed, counted. */
export interface RescoringSummaryDto {
  /** Entries re-scored (their supplier is in the run). */
  rescored: number;
  /** Entries created for new single points of failure (or suppliers newly rated medium+). */
  created: number;
  /** Entries whose rating changed. */
  ratingChanged: number;
  /** Entries flagged `supplier_removed`. */
  supplierRemoved: number;
  /** Entries flagged `no_longer_matters`. */
  noLongerMatters: number;
  /** The re-scoring compared with (the previous succeeded one), if any. */
  previousRescoringId: number | null;
  /** E-mails sent when it ended. */
  mailsSent: number;
}

/** A re-scoring as listed. */
export interface RescoringRunDto {
  id: number;
  quarterLabel: string;
  networkVersionId: number;
  /** The analysis run of the current attempt; its progress is the re-scoring's. */
  analysisRunId: number | null;
  status: RescoringStatus;
  trigger: 'schedule' | 'manual';
  isForced: boolean;
  attempts: number;
  /** 0-1, from the analysis run while it runs. */
  progress: number;
  stage: string | null;
  summary: RescoringSummaryDto | null;
  error: string | null;
  startedBy: { id: number; name: string } | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

/** POST /api/rescoring body (Start re-scoring). */
export const startRescoringSchema = z.object({
  /** Defaults to the latest network version. */
  networkVersionId: z.number().int().positive().optional(),
  /** Defaults to the quarter of now, in the schedule's time zone (`2027-Q1`). */
  quarterLabel: z.string().trim().regex(/^\d{4}-Q[1-4]$/, 'a quarter as 2027-Q1').optional(),
  /** Admins only: another re-scoring of a quarter that already has one. */
  force: z.boolean().default(false),
});
/** POST /api/rescoring body. */
export type StartRescoringInput = z.infer<typeof startRescoringSchema>;

/** POST /api/rescoring/:id/resume body: `resume` reruns the same version, `restart` the latest. */
export const resumeRescoringSchema = z.object({
  mode: z.enum(['resume', 'restart']).default('resume'),
});
/** POST /api/rescoring/:id/resume body. */
export type ResumeRescoringInput = z.infer<typeof resumeRescoringSchema>;

/** GET /api/rescoring answer, newest first. */
export interface RescoringListDto {
  items: RescoringRunDto[];
  total: number;
}

/** The re-scoring timetable an admin edits (stored in app settings). */
export const rescoringScheduleSchema = z.object({
  /** node-cron expression; default `0 6 * 1,4,7,10 1#1` (06:00, first Monday of a quarter). */
  cron: z.string().trim().min(9).max(100),
  /** IANA time zone the expression and the quarter labels are read in. */
  timeZone: z.string().trim().min(1).max(64),
  isEnabled: z.boolean(),
});
/** The re-scoring timetable. */
export type RescoringScheduleInput = z.infer<typeof rescoringScheduleSchema>;

/** GET /api/rescoring/schedule answer. */
export interface RescoringScheduleDto extends RescoringScheduleInput {
  /** The next time it fires (ISO), or null when disabled. */
  nextRunAt: string | null;
  updatedAt: string | null;
}

/** One supplier's row in a comparison of two runs. */
export interface ComparisonRowDto {
  code: string;
  name: string;
  tier: number | null;
  /** Values in the earlier run (null: not in it). */
  before: { rating: number; ratingBand: RatingBand; revenueImpact: number;
    singlePointOfFailure: boolean } | null;
  /** Values in the later run (null: not in it). */
  after: { rating: number; ratingBand: RatingBand; revenueImpact: number;
    singlePointOfFailure: boolean } | null;
  ratingChange: number;
  revenueImpactChange: number;
}

/** GET /api/comparison answer: what changed between run `fromRunId` and run `toRunId`. */
export interface RunComparisonDto {
  fromRun: { id: number; label: string; networkVersionId: number; finishedAt: string | null;
    quarterLabel: string | null };
  toRun: { id: number; label: string; networkVersionId: number; finishedAt: string | null;
    quarterLabel: string | null };
  newSinglePoints: ComparisonRowDto[];
  goneSinglePoints: ComparisonRowDto[];
  /** Biggest rises in rating, then in revenue impact (top 20 each). */
  risers: ComparisonRowDto[];
  fallers: ComparisonRowDto[];
  suppliersAdded: ComparisonRowDto[];
  suppliersRemoved: ComparisonRowDto[];
}

/** GET /api/comparison query: both default to the last two succeeded quarterly runs. */
export const comparisonQuerySchema = z.object({
  from: z.coerce.number().int().positive().optional(),
  to: z.coerce.number().int().positive().optional(),
});
/** GET /api/comparison query. */
export type ComparisonQuery = z.infer<typeof comparisonQuerySchema>;

/** One quarter of the trends. */
export interface QuarterTrendDto {
  quarterLabel: string;
  rescoringId: number;
  analysisRunId: number;
  totalRevenueImpact: number;
  singlePointsOfFailure: number;
  highEntries: number;
  criticalEntries: number;
}

/** GET /api/comparison/trends answer, oldest quarter first. */
export interface RescoringTrendsDto {
  items: QuarterTrendDto[];
}

/** A register entry's score at one re-scoring (its risk page's quarterly trend). */
export interface EntryScoreDto {
  quarterLabel: string;
  rescoringId: number;
  rating: number;
  ratingBand: RatingBand;
  previousRating: number | null;
  revenueImpact: number | null;
  flag: RegisterFlag | null;
  createdAt: string;
}

/** GET /api/dashboard answer: the figures of the signed-in user's role, each with its link. */
export interface DashboardDto {
  role: string;
  /** No network imported yet: the page says to import first. */
  hasNetwork: boolean;
  /**
   * Open entries by rating band (plant managers: their plants): status `open` or `mitigating`,
   * the risks still live.
   */
  openEntriesByBand: Record<RatingBand, number> | null;
  /** The same entries split by status, so each figure links to one register filter. */
  entriesByStatus?: Record<'open' | 'mitigating', Record<RatingBand, number>> | null;
  lastRun: { id: number; label: string; finishedAt: string | null; kind: string } | null;
  lastRescoring: (Pick<RescoringRunDto, 'id' | 'quarterLabel' | 'status' | 'finishedAt'> & {
    summary: RescoringSummaryDto | null }) | null;
  /** Plans waiting for approval (risk managers, admins: all; plant managers: theirs). */
  plansAwaitingApproval: number | null;
  /**
   * Overdue tasks: to do or doing, due before today (UTC), on an approved or in-progress plan
   * (risk managers, admins: all; plant managers: their own).
   */
  overdueTasks: number | null;
  /** Risk managers, admins: how many of the overdue tasks are their own (My tasks lists them). */
  myOverdueTasks?: number | null;
  /** Plant managers: their plants' top register entries. */
  topRisks: { id: number; title: string; supplierCode: string; rating: number;
    ratingBand: RatingBand; plants?: string[] }[] | null;
  /**
   * Administrators: notification e-mails the mail server has not taken yet, waiting to be tried
   * again (`pending`) or given up (`failed`); both 0 when all went out.
   */
  unsentMail?: { pending: number; failed: number } | null;
  /** Buyers: the last import and its warnings. */
  lastImport: { id: number; fileName: string; status: string; warningCount: number;
    errorCount: number; createdAt: string } | null;
}

import type {
  AnalysisRunDto,
  RunProgressEvent,
  RunSupplierDto,
  ScenarioDto,
  ScenarioResultDto,
} from '@keelson/contracts';

/**
 * Answers of the runs API for the client's specs, shaped like the DTOs in
 * libs/contracts/src/runs.ts, and a scripted stand-in for `EventSource`. Invented companies and
 * codes in the demo's naming pattern; nothing here describes a real supplier.
 */

/** A run with every field overridable (a finished run of version 3 by default). */
export function runRow(id: number, overrides: Partial<AnalysisRunDto> = {}): AnalysisRunDto {
  return {
    id,
    networkVersionId: 3,
    label: `Review ${id}`,
    kind: 'manual',
    status: 'succeeded',
    progress: 1,
    stage: null,
    error: null,
    createdBy: { id: 3, name: 'Rania Okafor' },
    createdAt: '2026-12-01T09:00:00.000Z',
    startedAt: '2026-12-01T09:00:01.000Z',
    finishedAt: '2026-12-01T09:02:06.000Z',
    timings: null,
    totals: {
      suppliers: 148,
      plants: 2,
      products: 14,
      nodes: 600,
      edges: 900,
      totalWeeklyRevenue: 1_200_000,
      singlePointsOfFailure: 9,
      productsDownAtBaseline: [],
    },
    methods: { closeness: { method: 'exact' } },
    ...overrides,
  };
}

/** A ranking row with every field overridable. */
export function rankingRow(code: string, overrides: Partial<RunSupplierDto> = {}): RunSupplierDto {
  return {
    rank: 1,
    code,
    name: 'Orvik Castings',
    country: 'DE',
    region: 'Europe',
    tier: 2,
    productsLost: ['FG-100', 'FG-110'],
    revenueExposedPerWeek: 84_000,
    revenueImpact: 504_000,
    timeToRecover: 8,
    singlePointOfFailure: true,
    betweenness: 0.4321,
    degree: 6,
    closeness: 0.3,
    eigenvector: 0.2,
    pagerank: 0.01,
    nexusIndex: 0.61,
    plants: ['P-NORTH'],
    likelihood: 4,
    likelihoodFactors: {},
    impactBand: 5,
    rating: 20,
    ratingBand: 'critical',
    ...overrides,
  };
}

/** A saved scenario. */
export function scenarioRow(id: number, overrides: Partial<ScenarioDto> = {}): ScenarioDto {
  return {
    id,
    name: `Scenario ${id}`,
    description: null,
    suppliers: ['S-2-SHARED-A'],
    countries: ['VN'],
    regions: [],
    createdBy: { id: 3, name: 'Rania Okafor' },
    createdAt: '2026-12-01T09:00:00.000Z',
    updatedAt: '2026-12-01T09:00:00.000Z',
    ...overrides,
  };
}

/** A scenario result with one lost product and its failure path. */
export function scenarioResult(networkVersionId = 3): ScenarioResultDto {
  return {
    networkVersionId,
    failed: ['S-2-SHARED-A'],
    productsLost: ['FG-100'],
    revenueExposedPerWeek: 42_000,
    revenueImpact: 210_000,
    timeToRecover: 8,
    products: [
      { code: 'FG-100', plantCode: 'P-NORTH', weeklyRevenue: 42_000, timeToSurvive: 3,
        lostWeeks: 5 },
    ],
    failurePaths: [
      {
        product: 'FG-100',
        nodes: [
          { id: 's', kind: 'supplier', code: 'S-2-SHARED-A', buyer: null, tier: 2, column: 2 },
          { id: 'i', kind: 'item', code: 'IT-7', buyer: 'S-1-0004', tier: null, column: 1 },
          { id: 'p', kind: 'product', code: 'FG-100', buyer: 'P-NORTH', tier: null, column: 0 },
        ],
      },
    ],
  };
}

type Listener = (event: MessageEvent<string>) => void;

/** A scripted `EventSource`: specs push events and failures into it by hand. */
export class FakeEventSource {
  /** Every stream opened since the last {@link FakeEventSource.reset}. */
  static opened: FakeEventSource[] = [];

  /** Forgets the streams of the previous test. */
  static reset(): void {
    FakeEventSource.opened = [];
  }

  onerror: ((event: Event) => void) | null = null;
  isClosed = false;
  private readonly listeners = new Map<string, Listener[]>();

  constructor(readonly url: string) {
    FakeEventSource.opened.push(this);
  }

  addEventListener(type: string, listener: Listener): void {
    this.listeners.set(type, [...(this.listeners.get(type) ?? []), listener]);
  }

  close(): void {
    this.isClosed = true;
  }

  /** Delivers one `progress` event, as the server would. */
  progress(event: RunProgressEvent): void {
    const message = new MessageEvent('progress', { data: JSON.stringify(event) });
    for (const listener of this.listeners.get('progress') ?? []) {
      listener(message);
    }
  }

  /** Breaks the stream. */
  fail(): void {
    this.onerror?.(new Event('error'));
  }
}

/** The factory to provide as `EVENT_SOURCE_FACTORY` in specs. */
export function fakeEventSourceFactory(url: string): EventSource {
  return new FakeEventSource(url) as unknown as EventSource;
}

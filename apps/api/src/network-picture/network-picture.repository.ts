import { eq } from 'drizzle-orm';
import { analysisRuns, runSuppliers, type KeelsonDatabase } from '@keelson/db';

/** The run facts the picture needs. */
export interface PictureRunRecord {
  id: number;
  networkVersionId: number;
  status: string;
}

/** A supplier row of a run, as far as the picture needs it. */
export interface PictureRunSupplier {
  code: string;
  singlePointOfFailure: boolean;
  revenueImpact: number;
  /** Plants of the products it would stop. */
  plants: string[];
}

/** Database reads of the network picture: a run and its supplier rows. */
export class NetworkPictureRepository {
  constructor(private readonly db: KeelsonDatabase) {}

  /** A run's id, version and status; null when there is no such run. */
  run(runId: number): PictureRunRecord | null {
    return (
      this.db
        .select({
          id: analysisRuns.id,
          networkVersionId: analysisRuns.networkVersionId,
          status: analysisRuns.status,
        })
        .from(analysisRuns)
        .where(eq(analysisRuns.id, runId))
        .get() ?? null
    );
  }

  /** The supplier rows of a run with a revenue impact or a single-point flag worth drawing. */
  runSuppliers(runId: number): PictureRunSupplier[] {
    return this.db
      .select({
        code: runSuppliers.code,
        singlePointOfFailure: runSuppliers.singlePointOfFailure,
        revenueImpact: runSuppliers.revenueImpact,
        plants: runSuppliers.plants,
      })
      .from(runSuppliers)
      .where(eq(runSuppliers.runId, runId))
      .all();
  }
}

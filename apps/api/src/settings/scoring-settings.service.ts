/**
 * The scoring settings as the API serves them: everyone reads them (screens explain the bands
 * with them), administrators change them. A change is saved together with the re-scoring of
 * the register, in one transaction; runs keep the settings they were made with.
 */
import type { KeelsonDatabase } from '@keelson/db';
import type { ScoringSettings } from '@keelson/scoring';
import { loadScoringSettings, saveScoringSettings } from './scoring-settings.repository';

/** What the settings service is built from. */
export interface ScoringSettingsServiceDeps {
  db: KeelsonDatabase;
  now: () => Date;
  /** Re-scores whatever depends on the settings (the register); returns how many rows changed. */
  afterChange: (settings: ScoringSettings) => number;
}

/** Reads and changes the workspace's scoring settings. */
export class ScoringSettingsService {
  constructor(private readonly deps: ScoringSettingsServiceDeps) {}

  /** The settings in force. */
  current(): ScoringSettings {
    return loadScoringSettings(this.deps.db);
  }

  /** Saves validated settings and re-scores; returns the saved settings and the rows changed. */
  replace(settings: ScoringSettings): { settings: ScoringSettings; rescored: number } {
    const rescored = this.deps.db.transaction(() => {
      saveScoringSettings(this.deps.db, settings, this.deps.now());
      return this.deps.afterChange(settings);
    });
    return { settings: this.current(), rescored };
  }
}

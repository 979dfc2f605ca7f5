/**
 * The scoring settings as the API serves them: everyone reads them (screens explain the bands
 * with them), administrators change them. A change is saved together with the re-scoring of
 * the register, in one transaction; runs keep the settings they were made with.
 */
import type { KeelsonDatabase } from '@keelson/db';
import type { ScoringSettings } from '@keelson/scoring';
import { recordAudit } from '../audit/audit-trail';
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

  /**
   * Saves validated settings and re-scores, recording the change (by `userId`) in the audit
   * trail; returns the saved settings and the rows changed.
   */
  replace(settings: ScoringSettings, userId: number | null = null):
    { settings: ScoringSettings; rescored: number } {
    const rescored = this.deps.db.transaction(() => {
      const before = loadScoringSettings(this.deps.db);
      const now = this.deps.now();
      saveScoringSettings(this.deps.db, settings, now);
      const changed = this.deps.afterChange(settings);
      recordAudit(this.deps.db, { action: 'settings.scoring_changed', subjectType: 'app_settings',
        subjectId: 'scoring', userId, before: { ...before }, after: { ...settings,
          registerEntriesRescored: changed } }, now);
      return changed;
    });
    return { settings: this.current(), rescored };
  }
}

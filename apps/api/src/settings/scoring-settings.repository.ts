/**
 * The workspace's scoring settings (spec section 7: impact band limits, likelihood weights,
 * rating band floors), stored as JSON under the `scoring` key of `app_settings`. Missing or
 * unreadable settings give the documented defaults. Shared by analysis runs (which keep a copy
 * of the settings they used) and the register; admins change them on the settings page.
 */
import { eq } from 'drizzle-orm';
import { appSettings, type KeelsonDatabase } from '@keelson/db';
import { SCORING_DEFAULTS, scoringSettingsSchema, type ScoringSettings } from '@keelson/scoring';

const KEY = 'scoring';

/** The current settings: the stored ones when valid, else the defaults. */
export function loadScoringSettings(db: KeelsonDatabase): ScoringSettings {
  const row = db.select().from(appSettings).where(eq(appSettings.key, KEY)).get();
  if (!row) return structuredClone(SCORING_DEFAULTS);
  try {
    const parsed = scoringSettingsSchema.safeParse(JSON.parse(row.value));
    return parsed.success ? (parsed.data as ScoringSettings) : structuredClone(SCORING_DEFAULTS);
  } catch {
    return structuredClone(SCORING_DEFAULTS);
  }
}

/** Stores settings (already validated by the caller with `scoringSettingsSchema`). */
export function saveScoringSettings(
  db: KeelsonDatabase,
  settings: ScoringSettings,
  now: Date,
): void {
  const value = JSON.stringify(settings);
  const updatedAt = now.toISOString();
  db.insert(appSettings)
    .values({ key: KEY, value, updatedAt })
    .onConflictDoUpdate({ target: appSettings.key, set: { value, updatedAt } })
    .run();
}

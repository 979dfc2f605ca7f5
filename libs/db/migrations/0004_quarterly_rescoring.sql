CREATE TABLE `register_entry_scores` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`entry_id` integer NOT NULL,
	`rescoring_run_id` integer NOT NULL,
	`likelihood` integer NOT NULL,
	`impact_band` integer NOT NULL,
	`rating` integer NOT NULL,
	`rating_band` text NOT NULL,
	`previous_rating` integer,
	`previous_rating_band` text,
	`revenue_impact` real,
	`flag` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`entry_id`) REFERENCES `register_entries`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`rescoring_run_id`) REFERENCES `rescoring_runs`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `register_entry_scores_once` ON `register_entry_scores` (`rescoring_run_id`,`entry_id`);--> statement-breakpoint
CREATE INDEX `register_entry_scores_entry_index` ON `register_entry_scores` (`entry_id`);--> statement-breakpoint
CREATE TABLE `rescoring_runs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`quarter_label` text NOT NULL,
	`network_version_id` integer NOT NULL,
	`analysis_run_id` integer,
	`status` text NOT NULL,
	`trigger` text NOT NULL,
	`is_forced` integer DEFAULT false NOT NULL,
	`attempts` integer DEFAULT 1 NOT NULL,
	`summary` text,
	`error` text,
	`started_by` integer,
	`created_at` text NOT NULL,
	`started_at` text,
	`finished_at` text,
	FOREIGN KEY (`network_version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`analysis_run_id`) REFERENCES `analysis_runs`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`started_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `rescoring_runs_quarter_lock` ON `rescoring_runs` (`quarter_label`) WHERE is_forced = 0 and status in ('queued', 'running', 'interrupted', 'succeeded');--> statement-breakpoint
CREATE INDEX `rescoring_runs_created_index` ON `rescoring_runs` (`created_at`);--> statement-breakpoint
ALTER TABLE `register_entries` ADD `flag` text;
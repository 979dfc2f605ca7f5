CREATE TABLE `analysis_runs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`network_version_id` integer NOT NULL,
	`label` text NOT NULL,
	`kind` text DEFAULT 'manual' NOT NULL,
	`status` text NOT NULL,
	`progress` real DEFAULT 0 NOT NULL,
	`stage` text,
	`error` text,
	`totals` text,
	`timings` text,
	`methods` text,
	`scoring_settings` text,
	`created_by` integer,
	`created_at` text NOT NULL,
	`started_at` text,
	`finished_at` text,
	FOREIGN KEY (`network_version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	CONSTRAINT "analysis_runs_status_known" CHECK("analysis_runs"."status" in ('queued', 'running', 'succeeded', 'failed', 'cancelled'))
);
--> statement-breakpoint
CREATE INDEX `analysis_runs_version_index` ON `analysis_runs` (`network_version_id`);--> statement-breakpoint
CREATE INDEX `analysis_runs_created_index` ON `analysis_runs` (`created_at`);--> statement-breakpoint
CREATE TABLE `likelihood_overrides` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`entry_id` integer NOT NULL,
	`likelihood` integer,
	`previous` integer,
	`reason` text NOT NULL,
	`user_id` integer,
	`created_at` text NOT NULL,
	FOREIGN KEY (`entry_id`) REFERENCES `register_entries`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `likelihood_overrides_entry_index` ON `likelihood_overrides` (`entry_id`);--> statement-breakpoint
CREATE TABLE `register_entries` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`supplier_code` text NOT NULL,
	`title` text NOT NULL,
	`origin` text NOT NULL,
	`status` text DEFAULT 'open' NOT NULL,
	`owner_id` integer,
	`run_id` integer,
	`computed_likelihood` integer NOT NULL,
	`likelihood_override` integer,
	`impact_band` integer NOT NULL,
	`rating` integer NOT NULL,
	`rating_band` text NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`created_by` integer,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`run_id`) REFERENCES `analysis_runs`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	CONSTRAINT "register_entries_status_known" CHECK("register_entries"."status" in ('open', 'mitigating', 'accepted', 'closed')),
	CONSTRAINT "register_entries_override_range" CHECK("register_entries"."likelihood_override" is null or "register_entries"."likelihood_override" between 1 and 5)
);
--> statement-breakpoint
CREATE INDEX `register_entries_supplier_index` ON `register_entries` (`supplier_code`);--> statement-breakpoint
CREATE INDEX `register_entries_rating_index` ON `register_entries` (`rating`);--> statement-breakpoint
CREATE TABLE `register_entry_plants` (
	`entry_id` integer NOT NULL,
	`plant_code` text NOT NULL,
	PRIMARY KEY(`entry_id`, `plant_code`),
	FOREIGN KEY (`entry_id`) REFERENCES `register_entries`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `register_entry_plants_plant_index` ON `register_entry_plants` (`plant_code`);--> statement-breakpoint
CREATE TABLE `run_supplier_plants` (
	`run_id` integer NOT NULL,
	`code` text NOT NULL,
	`plant_code` text NOT NULL,
	PRIMARY KEY(`run_id`, `code`, `plant_code`),
	FOREIGN KEY (`run_id`) REFERENCES `analysis_runs`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `run_supplier_plants_plant_index` ON `run_supplier_plants` (`run_id`,`plant_code`);--> statement-breakpoint
CREATE TABLE `run_suppliers` (
	`run_id` integer NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`country` text NOT NULL,
	`region` text NOT NULL,
	`tier` integer,
	`rank` integer NOT NULL,
	`products_lost` text NOT NULL,
	`products_lost_count` integer NOT NULL,
	`plants` text NOT NULL,
	`revenue_exposed_per_week` real NOT NULL,
	`revenue_impact` real NOT NULL,
	`time_to_recover` real NOT NULL,
	`single_point_of_failure` integer NOT NULL,
	`betweenness` real NOT NULL,
	`degree` real NOT NULL,
	`closeness` real NOT NULL,
	`eigenvector` real NOT NULL,
	`pagerank` real NOT NULL,
	`nexus_index` real NOT NULL,
	`products` text NOT NULL,
	`likelihood` integer NOT NULL,
	`likelihood_factors` text NOT NULL,
	`impact_band` integer NOT NULL,
	`rating` integer NOT NULL,
	`rating_band` text NOT NULL,
	PRIMARY KEY(`run_id`, `code`),
	FOREIGN KEY (`run_id`) REFERENCES `analysis_runs`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `run_suppliers_rank_index` ON `run_suppliers` (`run_id`,`rank`);--> statement-breakpoint
CREATE INDEX `run_suppliers_code_index` ON `run_suppliers` (`code`,`run_id`);--> statement-breakpoint
CREATE TABLE `scenarios` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`description` text,
	`suppliers` text NOT NULL,
	`countries` text NOT NULL,
	`regions` text NOT NULL,
	`created_by` integer,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `scenarios_name_unique` ON `scenarios` (`name`);
CREATE TABLE `countries` (
	`code` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`region` text NOT NULL,
	`hazard` integer NOT NULL,
	`is_default` integer DEFAULT true NOT NULL,
	`updated_at` text NOT NULL,
	`updated_by` integer,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	CONSTRAINT "countries_hazard_range" CHECK("countries"."hazard" between 1 and 5)
);
--> statement-breakpoint
CREATE TABLE `import_batches` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`status` text NOT NULL,
	`file_name` text NOT NULL,
	`file_size` integer NOT NULL,
	`sha256` text NOT NULL,
	`format` text,
	`header_signature` text,
	`mapping` text,
	`mapping_id` integer,
	`sheets` text NOT NULL,
	`counts` text NOT NULL,
	`errors` text NOT NULL,
	`warnings` text NOT NULL,
	`error_count` integer NOT NULL,
	`warning_count` integer NOT NULL,
	`created_by` integer,
	`created_at` text NOT NULL,
	`committed_at` text,
	FOREIGN KEY (`mapping_id`) REFERENCES `import_mappings`(`id`) ON UPDATE no action ON DELETE set null,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	CONSTRAINT "import_batches_status_known" CHECK("import_batches"."status" in ('needs_mapping', 'rejected', 'ready', 'committed'))
);
--> statement-breakpoint
CREATE INDEX `import_batches_created_index` ON `import_batches` (`created_at`);--> statement-breakpoint
CREATE INDEX `import_batches_sha_index` ON `import_batches` (`sha256`);--> statement-breakpoint
CREATE TABLE `import_files` (
	`batch_id` integer PRIMARY KEY NOT NULL,
	`data` blob NOT NULL,
	FOREIGN KEY (`batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `import_mappings` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`header_signature` text NOT NULL,
	`mapping` text NOT NULL,
	`created_by` integer,
	`created_at` text NOT NULL,
	`last_used_at` text,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `import_mappings_name_unique` ON `import_mappings` (`name`);--> statement-breakpoint
CREATE INDEX `import_mappings_signature_index` ON `import_mappings` (`header_signature`);--> statement-breakpoint
CREATE TABLE `network_bom_lines` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`version_id` integer NOT NULL,
	`parent_code` text NOT NULL,
	`child_code` text NOT NULL,
	`qty_per` real NOT NULL,
	`row` integer,
	`attributes` text,
	FOREIGN KEY (`version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `network_bom_parent_index` ON `network_bom_lines` (`version_id`,`parent_code`);--> statement-breakpoint
CREATE INDEX `network_bom_child_index` ON `network_bom_lines` (`version_id`,`child_code`);--> statement-breakpoint
CREATE TABLE `network_items` (
	`version_id` integer NOT NULL,
	`code` text NOT NULL,
	`holder_code` text NOT NULL,
	`holder_kind` text NOT NULL,
	`kind` text NOT NULL,
	`qualified_sources` integer NOT NULL,
	`used_in` integer NOT NULL,
	`weeks_of_cover` real,
	PRIMARY KEY(`version_id`, `holder_code`, `code`),
	FOREIGN KEY (`version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `network_items_code_index` ON `network_items` (`version_id`,`code`);--> statement-breakpoint
CREATE TABLE `network_plants` (
	`version_id` integer NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`country` text NOT NULL,
	`row` integer,
	`attributes` text,
	PRIMARY KEY(`version_id`, `code`),
	FOREIGN KEY (`version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `network_products` (
	`version_id` integer NOT NULL,
	`code` text NOT NULL,
	`plant_code` text NOT NULL,
	`name` text NOT NULL,
	`weekly_revenue` real NOT NULL,
	`row` integer,
	`attributes` text,
	PRIMARY KEY(`version_id`, `code`),
	FOREIGN KEY (`version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `network_products_plant_index` ON `network_products` (`version_id`,`plant_code`);--> statement-breakpoint
CREATE TABLE `network_sourcing` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`version_id` integer NOT NULL,
	`buyer_code` text NOT NULL,
	`item_code` text NOT NULL,
	`supplier_code` text NOT NULL,
	`share_pct` real,
	`is_qualified` integer NOT NULL,
	`row` integer,
	`attributes` text,
	FOREIGN KEY (`version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `network_sourcing_supplier_index` ON `network_sourcing` (`version_id`,`supplier_code`,`buyer_code`);--> statement-breakpoint
CREATE INDEX `network_sourcing_buyer_index` ON `network_sourcing` (`version_id`,`buyer_code`,`item_code`);--> statement-breakpoint
CREATE TABLE `network_stock` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`version_id` integer NOT NULL,
	`plant_code` text NOT NULL,
	`item_code` text NOT NULL,
	`weeks_of_cover` real NOT NULL,
	`row` integer,
	`attributes` text,
	FOREIGN KEY (`version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `network_stock_item_index` ON `network_stock` (`version_id`,`plant_code`,`item_code`);--> statement-breakpoint
CREATE TABLE `network_supplier_plants` (
	`version_id` integer NOT NULL,
	`supplier_code` text NOT NULL,
	`plant_code` text NOT NULL,
	PRIMARY KEY(`version_id`, `supplier_code`, `plant_code`),
	FOREIGN KEY (`version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `network_supplier_plants_plant_index` ON `network_supplier_plants` (`version_id`,`plant_code`);--> statement-breakpoint
CREATE TABLE `network_suppliers` (
	`version_id` integer NOT NULL,
	`code` text NOT NULL,
	`name` text NOT NULL,
	`country` text NOT NULL,
	`region` text NOT NULL,
	`recovery_weeks` real NOT NULL,
	`financial_health` integer,
	`delivery_score` integer,
	`has_continuity_plan` integer,
	`tier` integer,
	`row` integer,
	`attributes` text,
	PRIMARY KEY(`version_id`, `code`),
	FOREIGN KEY (`version_id`) REFERENCES `network_versions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `network_suppliers_country_index` ON `network_suppliers` (`version_id`,`country`);--> statement-breakpoint
CREATE INDEX `network_suppliers_tier_index` ON `network_suppliers` (`version_id`,`tier`);--> statement-breakpoint
CREATE INDEX `network_suppliers_name_index` ON `network_suppliers` (`version_id`,`name`);--> statement-breakpoint
CREATE TABLE `network_versions` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`label` text NOT NULL,
	`import_batch_id` integer NOT NULL,
	`previous_version_id` integer,
	`counts` text NOT NULL,
	`changes` text NOT NULL,
	`created_by` integer,
	`created_at` text NOT NULL,
	FOREIGN KEY (`import_batch_id`) REFERENCES `import_batches`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `network_versions_batch_unique` ON `network_versions` (`import_batch_id`);
CREATE TABLE `audit_events` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`action` text NOT NULL,
	`subject_type` text NOT NULL,
	`subject_id` text NOT NULL,
	`user_id` integer,
	`before` text,
	`after` text,
	`created_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `audit_events_subject_index` ON `audit_events` (`subject_type`,`subject_id`);--> statement-breakpoint
CREATE INDEX `audit_events_created_index` ON `audit_events` (`created_at`);--> statement-breakpoint
CREATE TABLE `mail_preferences` (
	`user_id` integer PRIMARY KEY NOT NULL,
	`unsubscribed` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `mitigation_plans` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`entry_id` integer NOT NULL,
	`strategy` text NOT NULL,
	`description` text NOT NULL,
	`estimated_cost` real,
	`target_date` text,
	`status` text DEFAULT 'draft' NOT NULL,
	`changes` text NOT NULL,
	`what_if` text,
	`rejection_comment` text,
	`author_id` integer,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	`submitted_at` text,
	`decided_at` text,
	FOREIGN KEY (`entry_id`) REFERENCES `register_entries`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `mitigation_plans_entry_index` ON `mitigation_plans` (`entry_id`);--> statement-breakpoint
CREATE INDEX `mitigation_plans_status_index` ON `mitigation_plans` (`status`);--> statement-breakpoint
CREATE TABLE `plan_decisions` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`plan_id` integer NOT NULL,
	`plant_code` text NOT NULL,
	`decision` text NOT NULL,
	`comment` text DEFAULT '' NOT NULL,
	`user_id` integer,
	`submitted_at` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`plan_id`) REFERENCES `mitigation_plans`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `plan_decisions_once_per_plant` ON `plan_decisions` (`plan_id`,`submitted_at`,`plant_code`);--> statement-breakpoint
CREATE TABLE `plan_tasks` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`plan_id` integer NOT NULL,
	`title` text NOT NULL,
	`owner_id` integer,
	`due_date` text,
	`status` text DEFAULT 'todo' NOT NULL,
	`created_at` text NOT NULL,
	`updated_at` text NOT NULL,
	FOREIGN KEY (`plan_id`) REFERENCES `mitigation_plans`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `plan_tasks_plan_index` ON `plan_tasks` (`plan_id`);--> statement-breakpoint
CREATE INDEX `plan_tasks_owner_index` ON `plan_tasks` (`owner_id`,`status`);--> statement-breakpoint
CREATE TABLE `task_comments` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`task_id` integer NOT NULL,
	`user_id` integer,
	`text` text NOT NULL,
	`created_at` text NOT NULL,
	FOREIGN KEY (`task_id`) REFERENCES `plan_tasks`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `task_comments_task_index` ON `task_comments` (`task_id`);--> statement-breakpoint
CREATE TRIGGER `audit_events_append_only_update` BEFORE UPDATE ON `audit_events`
BEGIN SELECT RAISE(ABORT, 'the audit trail is append-only: rows are never changed'); END;
--> statement-breakpoint
CREATE TRIGGER `audit_events_append_only_delete` BEFORE DELETE ON `audit_events`
BEGIN SELECT RAISE(ABORT, 'the audit trail is append-only: rows are never deleted'); END;

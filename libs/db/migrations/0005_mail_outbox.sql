CREATE TABLE `mail_outbox` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`kind` text NOT NULL,
	`to_addresses` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`html` text NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`next_attempt_at` text NOT NULL,
	`last_error` text,
	`created_at` text NOT NULL,
	`sent_at` text,
	CONSTRAINT "mail_outbox_status_check" CHECK("mail_outbox"."status" in ('pending', 'sent', 'failed'))
);
--> statement-breakpoint
CREATE INDEX `mail_outbox_due_index` ON `mail_outbox` (`status`,`next_attempt_at`);
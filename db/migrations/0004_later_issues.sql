CREATE TABLE `app_settings` (
	`key` text PRIMARY KEY NOT NULL,
	`value` text NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `bench_scenarios` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`steps` text NOT NULL,
	`created_by` text,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `bench_scenarios_site_name` ON `bench_scenarios` (`site_id`,`name`);--> statement-breakpoint
CREATE TABLE `bench_sessions` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`user_id` text NOT NULL,
	`source` text NOT NULL,
	`version_id` text,
	`draft_revision` integer,
	`state` text NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `bench_sessions_site_user` ON `bench_sessions` (`site_id`,`user_id`);--> statement-breakpoint
CREATE TABLE `bench_steps` (
	`seq` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`session_id` text NOT NULL,
	`at` integer NOT NULL,
	`input` text NOT NULL,
	`output` text NOT NULL,
	FOREIGN KEY (`session_id`) REFERENCES `bench_sessions`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `bench_steps_session` ON `bench_steps` (`session_id`,`seq`);--> statement-breakpoint
CREATE TABLE `inbox_items` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` text NOT NULL,
	`site_id` text NOT NULL,
	`outbox_id` integer,
	`kind` text NOT NULL,
	`text` text NOT NULL,
	`url` text,
	`count` integer DEFAULT 1 NOT NULL,
	`at` integer NOT NULL,
	`read_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`outbox_id`) REFERENCES `notices_outbox`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `inbox_items_outbox_user` ON `inbox_items` (`outbox_id`,`user_id`);--> statement-breakpoint
CREATE INDEX `inbox_items_user` ON `inbox_items` (`user_id`,`read_at`,`at`);--> statement-breakpoint
CREATE TABLE `notice_deliveries` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`outbox_id` integer NOT NULL,
	`user_id` text NOT NULL,
	`channel` text NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`next_attempt_at` integer NOT NULL,
	`last_error` text,
	`count` integer DEFAULT 1 NOT NULL,
	`lease_owner` text,
	`lease_until` integer,
	`sent_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`outbox_id`) REFERENCES `notices_outbox`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `notice_deliveries_unique` ON `notice_deliveries` (`outbox_id`,`user_id`,`channel`);--> statement-breakpoint
CREATE INDEX `notice_deliveries_due` ON `notice_deliveries` (`status`,`next_attempt_at`);--> statement-breakpoint
CREATE INDEX `notice_deliveries_user` ON `notice_deliveries` (`user_id`,`channel`,`created_at`);--> statement-breakpoint
CREATE TABLE `notice_preferences` (
	`site_id` text NOT NULL,
	`user_id` text NOT NULL,
	`kinds` text,
	`channels` text NOT NULL,
	`quiet_from` text,
	`quiet_to` text,
	`updated_at` integer NOT NULL,
	PRIMARY KEY(`site_id`, `user_id`),
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `push_subscriptions` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`endpoint` text NOT NULL,
	`p256dh` text NOT NULL,
	`auth` text NOT NULL,
	`origin` text DEFAULT 'browser' NOT NULL,
	`label` text DEFAULT '' NOT NULL,
	`created_at` integer NOT NULL,
	`last_success_at` integer,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `push_subscriptions_endpoint_unique` ON `push_subscriptions` (`endpoint`);--> statement-breakpoint
CREATE INDEX `push_subscriptions_user` ON `push_subscriptions` (`user_id`);--> statement-breakpoint
CREATE TABLE `replay_jobs` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`created_by` text,
	`status` text DEFAULT 'queued' NOT NULL,
	`params` text NOT NULL,
	`processed` integer DEFAULT 0 NOT NULL,
	`total` integer DEFAULT 0 NOT NULL,
	`cancel_requested` integer DEFAULT false NOT NULL,
	`error` text,
	`result` text,
	`lease_owner` text,
	`lease_until` integer,
	`created_at` integer NOT NULL,
	`started_at` integer,
	`finished_at` integer,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `replay_jobs_site` ON `replay_jobs` (`site_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `replay_jobs_status` ON `replay_jobs` (`status`);--> statement-breakpoint
CREATE TABLE `rule_set_activations` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`site_id` text NOT NULL,
	`version_id` text NOT NULL,
	`activated_by` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`version_id`) REFERENCES `rule_set_versions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`activated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `rule_set_activations_site` ON `rule_set_activations` (`site_id`,`id`);--> statement-breakpoint
ALTER TABLE `notices_outbox` ADD `kind` text DEFAULT 'other' NOT NULL;--> statement-breakpoint
ALTER TABLE `notices_outbox` ADD `url` text;
CREATE TABLE `api_keys` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`prefix` text NOT NULL,
	`key_hash` text NOT NULL,
	`created_at` integer NOT NULL,
	`created_by` text,
	`last_used_at` integer,
	`revoked_at` integer,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `api_keys_key_hash_unique` ON `api_keys` (`key_hash`);--> statement-breakpoint
CREATE INDEX `api_keys_site` ON `api_keys` (`site_id`);--> statement-breakpoint
CREATE TABLE `engine_states` (
	`site_id` text PRIMARY KEY NOT NULL,
	`state` text NOT NULL,
	`version_id` text,
	`revision` integer DEFAULT 0 NOT NULL,
	`next_timer_at` integer,
	`lease_owner` text,
	`lease_until` integer,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `engine_steps` (
	`seq` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`site_id` text NOT NULL,
	`event_seq` integer,
	`at` integer NOT NULL,
	`version_id` text,
	`output` text NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`event_seq`) REFERENCES `events`(`seq`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `engine_steps_site_seq` ON `engine_steps` (`site_id`,`seq`);--> statement-breakpoint
CREATE INDEX `engine_steps_event` ON `engine_steps` (`event_seq`);--> statement-breakpoint
CREATE TABLE `events` (
	`seq` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`site_id` text NOT NULL,
	`event_id` text NOT NULL,
	`at` integer NOT NULL,
	`device` text NOT NULL,
	`kind` text NOT NULL,
	`value` text,
	`source` text NOT NULL,
	`received_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `events_site_event` ON `events` (`site_id`,`event_id`);--> statement-breakpoint
CREATE INDEX `events_site_at` ON `events` (`site_id`,`at`);--> statement-breakpoint
CREATE TABLE `gateway_commands` (
	`seq` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`site_id` text NOT NULL,
	`step_seq` integer NOT NULL,
	`at` integer NOT NULL,
	`command` text NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `gateway_commands_site_seq` ON `gateway_commands` (`site_id`,`seq`);--> statement-breakpoint
CREATE TABLE `notices_outbox` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`site_id` text NOT NULL,
	`dedupe_key` text NOT NULL,
	`recipient` text NOT NULL,
	`channels` text NOT NULL,
	`text` text NOT NULL,
	`at` integer NOT NULL,
	`status` text DEFAULT 'pending' NOT NULL,
	`lease_owner` text,
	`lease_until` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `notices_outbox_site_dedupe` ON `notices_outbox` (`site_id`,`dedupe_key`);--> statement-breakpoint
CREATE INDEX `notices_outbox_status` ON `notices_outbox` (`status`);--> statement-breakpoint
CREATE TABLE `rule_set_versions` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`number` integer NOT NULL,
	`graph` text NOT NULL,
	`rules` text NOT NULL,
	`created_at` integer NOT NULL,
	`created_by` text,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `rule_set_versions_site_number` ON `rule_set_versions` (`site_id`,`number`);--> statement-breakpoint
CREATE TABLE `rule_sets` (
	`site_id` text PRIMARY KEY NOT NULL,
	`draft_graph` text NOT NULL,
	`draft_revision` integer DEFAULT 1 NOT NULL,
	`active_version_id` text,
	`updated_at` integer NOT NULL,
	`updated_by` text,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`updated_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);

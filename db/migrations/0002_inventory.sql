CREATE TABLE `floors` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`sort_order` integer DEFAULT 0 NOT NULL,
	`plan_upload_id` text,
	`pixels_per_metre` real,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`plan_upload_id`) REFERENCES `uploads`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `floors_site_name` ON `floors` (`site_id`,`name`);--> statement-breakpoint
CREATE TABLE `scenes` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`number` integer NOT NULL,
	`name` text NOT NULL,
	`fade_ms` integer DEFAULT 0 NOT NULL,
	`is_occupant_recallable` integer DEFAULT false NOT NULL,
	`levels` text DEFAULT '[]' NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `scenes_site_number` ON `scenes` (`site_id`,`number`);--> statement-breakpoint
CREATE UNIQUE INDEX `scenes_site_name` ON `scenes` (`site_id`,`name`);--> statement-breakpoint
CREATE TABLE `uploads` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`stored_name` text NOT NULL,
	`mime_type` text NOT NULL,
	`byte_size` integer NOT NULL,
	`width` integer NOT NULL,
	`height` integer NOT NULL,
	`original_name` text DEFAULT '' NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `uploads_stored_name_unique` ON `uploads` (`stored_name`);--> statement-breakpoint
ALTER TABLE `devices` ADD `floor_id` text REFERENCES floors(id) ON DELETE set null;--> statement-breakpoint
ALTER TABLE `devices` ADD `x` real;--> statement-breakpoint
ALTER TABLE `devices` ADD `y` real;--> statement-breakpoint
CREATE UNIQUE INDEX `devices_site_name` ON `devices` (`site_id`,`name`);
CREATE TABLE `devices` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`zone_id` text,
	`name` text NOT NULL,
	`kind` text NOT NULL,
	`unicast_address` integer NOT NULL,
	`element_count` integer DEFAULT 1 NOT NULL,
	`profile` text DEFAULT '{}' NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`zone_id`) REFERENCES `zones`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `devices_site_unicast` ON `devices` (`site_id`,`unicast_address`);--> statement-breakpoint
CREATE INDEX `devices_site_zone` ON `devices` (`site_id`,`zone_id`);--> statement-breakpoint
CREATE TABLE `sites` (
	`id` text PRIMARY KEY NOT NULL,
	`name` text NOT NULL,
	`address` text DEFAULT '' NOT NULL,
	`time_zone` text NOT NULL,
	`latitude` real NOT NULL,
	`longitude` real NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `zones` (
	`id` text PRIMARY KEY NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`group_address` integer NOT NULL,
	`sort_order` integer DEFAULT 0 NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`site_id`) REFERENCES `sites`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `zones_site_group_address` ON `zones` (`site_id`,`group_address`);--> statement-breakpoint
CREATE UNIQUE INDEX `zones_site_name` ON `zones` (`site_id`,`name`);
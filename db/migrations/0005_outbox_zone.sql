ALTER TABLE `notices_outbox` ADD `zone_id` text REFERENCES zones(id) ON DELETE set null;

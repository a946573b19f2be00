CREATE TABLE `bill` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text NOT NULL,
	`site_id` text NOT NULL,
	`period_start` text NOT NULL,
	`period_end` text NOT NULL,
	`kwh` real NOT NULL,
	`billed_demand` real,
	`demand_unit` text DEFAULT 'kW' NOT NULL,
	`kvarh` real,
	`pf` real,
	`pf_charge` real,
	`total` real,
	`currency` text NOT NULL,
	`document_file_id` text,
	`source` text NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `site`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`document_file_id`) REFERENCES `stored_file`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `bill_site_period_idx` ON `bill` (`site_id`,`period_start`,`period_end`);--> statement-breakpoint
CREATE INDEX `bill_org_idx` ON `bill` (`organization_id`);--> statement-breakpoint
CREATE TABLE `interval_block` (
	`meter_id` text NOT NULL,
	`day` integer NOT NULL,
	`organization_id` text NOT NULL,
	`import_id` text NOT NULL,
	`interval_minutes` integer NOT NULL,
	`count` integer NOT NULL,
	`start_ms` blob NOT NULL,
	`kwh` blob NOT NULL,
	`kvarh_lag` blob NOT NULL,
	`kvarh_lead` blob NOT NULL,
	`flags` blob NOT NULL,
	PRIMARY KEY(`meter_id`, `day`),
	FOREIGN KEY (`meter_id`) REFERENCES `meter`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `interval_block_org_idx` ON `interval_block` (`organization_id`);--> statement-breakpoint
CREATE TABLE `meter` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`interval_minutes` integer,
	`reactive_source` text,
	`import_profile` text,
	`created_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `site`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `meter_site_name_idx` ON `meter` (`site_id`,`name`);--> statement-breakpoint
CREATE INDEX `meter_org_idx` ON `meter` (`organization_id`);--> statement-breakpoint
CREATE TABLE `meter_import` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text NOT NULL,
	`site_id` text NOT NULL,
	`file_id` text NOT NULL,
	`status` text NOT NULL,
	`mapping` text NOT NULL,
	`quality` text,
	`problems` text,
	`total_problems` integer DEFAULT 0 NOT NULL,
	`bytes_total` integer DEFAULT 0 NOT NULL,
	`bytes_processed` integer DEFAULT 0 NOT NULL,
	`rows_processed` integer DEFAULT 0 NOT NULL,
	`intervals` integer DEFAULT 0 NOT NULL,
	`first_start_ms` integer,
	`last_start_ms` integer,
	`replaced` integer DEFAULT false NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	`finished_at` integer,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `site`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`file_id`) REFERENCES `stored_file`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `meter_import_site_idx` ON `meter_import` (`site_id`,`created_at`);--> statement-breakpoint
CREATE INDEX `meter_import_org_idx` ON `meter_import` (`organization_id`);--> statement-breakpoint
CREATE TABLE `stored_file` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text NOT NULL,
	`site_id` text,
	`kind` text NOT NULL,
	`sha256` text NOT NULL,
	`file_name` text NOT NULL,
	`content_type` text NOT NULL,
	`bytes` integer NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `site`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `stored_file_site_kind_sha_idx` ON `stored_file` (`site_id`,`kind`,`sha256`);--> statement-breakpoint
CREATE INDEX `stored_file_org_idx` ON `stored_file` (`organization_id`);--> statement-breakpoint
CREATE TABLE `tariff` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`effective_from` text NOT NULL,
	`definition` text NOT NULL,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	`updated_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `site`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `tariff_site_from_idx` ON `tariff` (`site_id`,`effective_from`);--> statement-breakpoint
CREATE INDEX `tariff_org_idx` ON `tariff` (`organization_id`);
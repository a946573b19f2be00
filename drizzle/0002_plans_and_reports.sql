CREATE TABLE `correction_plan` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text NOT NULL,
	`site_id` text NOT NULL,
	`name` text NOT NULL,
	`spec` text NOT NULL,
	`summary` text,
	`created_by` text,
	`created_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	`updated_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `site`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `correction_plan_site_idx` ON `correction_plan` (`site_id`);--> statement-breakpoint
CREATE INDEX `correction_plan_org_idx` ON `correction_plan` (`organization_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `correction_plan_site_name_idx` ON `correction_plan` (`site_id`,`name`);--> statement-breakpoint
CREATE TABLE `savings_report` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text NOT NULL,
	`site_id` text NOT NULL,
	`plan_id` text,
	`title` text NOT NULL,
	`snapshot` text NOT NULL,
	`issued_by` text,
	`issued_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`site_id`) REFERENCES `site`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`plan_id`) REFERENCES `correction_plan`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `savings_report_site_idx` ON `savings_report` (`site_id`);--> statement-breakpoint
CREATE INDEX `savings_report_org_idx` ON `savings_report` (`organization_id`);
CREATE TABLE `payment_event` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text,
	`purchase_id` text,
	`type` text NOT NULL,
	`outcome` text NOT NULL,
	`detail` text,
	`received_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`purchase_id`) REFERENCES `purchase`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `payment_event_org_idx` ON `payment_event` (`organization_id`);--> statement-breakpoint
CREATE TABLE `purchase` (
	`id` text PRIMARY KEY NOT NULL,
	`organization_id` text NOT NULL,
	`checkout_session_id` text,
	`checkout_url` text,
	`status` text DEFAULT 'pending' NOT NULL,
	`unit_amount` integer NOT NULL,
	`amount_total` integer NOT NULL,
	`currency` text NOT NULL,
	`site_ids` text NOT NULL,
	`site_names` text NOT NULL,
	`buyer_user_id` text,
	`buyer_email` text NOT NULL,
	`buyer_name` text DEFAULT '' NOT NULL,
	`receipt_number` text,
	`payment_intent_id` text,
	`created_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	`paid_at` integer,
	`closed_at` integer,
	FOREIGN KEY (`organization_id`) REFERENCES `organization`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `purchase_checkout_session_id_unique` ON `purchase` (`checkout_session_id`);--> statement-breakpoint
CREATE UNIQUE INDEX `purchase_receipt_number_unique` ON `purchase` (`receipt_number`);--> statement-breakpoint
CREATE INDEX `purchase_org_idx` ON `purchase` (`organization_id`,`created_at`);
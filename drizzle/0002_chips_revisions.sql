CREATE TABLE `analyses` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`revision_id` integer NOT NULL,
	`operating_point_id` integer NOT NULL,
	`status` text NOT NULL,
	`result` text,
	`error_code` text,
	`error_message` text,
	`engine_version` integer NOT NULL,
	`segment_count` integer,
	`max_inlet_pressure_pa` real,
	`total_flow_m3_per_s` real,
	`mean_residence_s` real,
	`max_reynolds` real,
	`footprint_m2` real,
	`flags_info` integer DEFAULT 0 NOT NULL,
	`flags_warn` integer DEFAULT 0 NOT NULL,
	`flags_block` integer DEFAULT 0 NOT NULL,
	`worst_severity` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`operating_point_id`) REFERENCES `operating_points`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `analyses_revision` ON `analyses` (`revision_id`);--> statement-breakpoint
CREATE INDEX `analyses_operating_point` ON `analyses` (`operating_point_id`);--> statement-breakpoint
CREATE TABLE `api_tokens` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	`name` text NOT NULL,
	`prefix` text NOT NULL,
	`token_hash` text NOT NULL,
	`created_at` integer NOT NULL,
	`last_used_at` integer,
	`revoked_at` integer,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `api_tokens_token_hash_unique` ON `api_tokens` (`token_hash`);--> statement-breakpoint
CREATE INDEX `api_tokens_user` ON `api_tokens` (`user_id`);--> statement-breakpoint
CREATE TABLE `chips` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`name` text NOT NULL,
	`purpose` text DEFAULT '' NOT NULL,
	`created_by_user_id` integer,
	`created_at` integer NOT NULL,
	`last_activity_at` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `chips_workspace_name` ON `chips` (`workspace_id`,`name`);--> statement-breakpoint
CREATE TABLE `layer_maps` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`revision_id` integer NOT NULL,
	`mapping` text NOT NULL,
	`created_by_user_id` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `layer_maps_revision_id_unique` ON `layer_maps` (`revision_id`);--> statement-breakpoint
CREATE TABLE `operating_points` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`revision_id` integer NOT NULL,
	`name` text NOT NULL,
	`conditions` text NOT NULL,
	`form` text NOT NULL,
	`created_by_user_id` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE INDEX `operating_points_revision` ON `operating_points` (`revision_id`);--> statement-breakpoint
CREATE TABLE `process_overrides` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`process_key` text NOT NULL,
	`values` text NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`updated_by_user_id` integer,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`updated_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `process_overrides_key` ON `process_overrides` (`workspace_id`,`process_key`);--> statement-breakpoint
CREATE TABLE `revisions` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`chip_id` integer NOT NULL,
	`number` integer NOT NULL,
	`parent_revision_id` integer,
	`uploaded_by_user_id` integer,
	`uploaded_at` integer NOT NULL,
	`file_name` text NOT NULL,
	`size_bytes` integer NOT NULL,
	`sha256` text NOT NULL,
	`storage_key` text NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`layers` text DEFAULT '[]' NOT NULL,
	`review_state` text DEFAULT 'draft' NOT NULL,
	`review_version` integer DEFAULT 0 NOT NULL,
	`review_state_since` integer NOT NULL,
	`review_analysis_id` integer,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`chip_id`) REFERENCES `chips`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`uploaded_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `revisions_chip_number` ON `revisions` (`chip_id`,`number`);--> statement-breakpoint
CREATE UNIQUE INDEX `revisions_chip_sha` ON `revisions` (`chip_id`,`sha256`);--> statement-breakpoint
CREATE INDEX `revisions_workspace_state` ON `revisions` (`workspace_id`,`review_state`);--> statement-breakpoint
CREATE TABLE `threshold_overrides` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`rule_code` text NOT NULL,
	`value` real NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`updated_by_user_id` integer,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`updated_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `threshold_overrides_code` ON `threshold_overrides` (`workspace_id`,`rule_code`);--> statement-breakpoint
CREATE TABLE `workspace_fluids` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`key` text NOT NULL,
	`name` text NOT NULL,
	`properties` text NOT NULL,
	`updated_by_user_id` integer,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`updated_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null
);
--> statement-breakpoint
CREATE UNIQUE INDEX `workspace_fluids_key` ON `workspace_fluids` (`workspace_id`,`key`);
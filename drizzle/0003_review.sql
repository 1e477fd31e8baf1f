CREATE TABLE `clearances` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`revision_id` integer NOT NULL,
	`by_user_id` integer NOT NULL,
	`at` integer NOT NULL,
	`fab_name` text NOT NULL,
	`process` text NOT NULL,
	`file_sha256` text NOT NULL,
	`analysis_id` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`analysis_id`) REFERENCES `analyses`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `clearances_revision_id_unique` ON `clearances` (`revision_id`);--> statement-breakpoint
CREATE TABLE `flag_dispositions` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`revision_id` integer NOT NULL,
	`analysis_id` integer NOT NULL,
	`flag_key` text NOT NULL,
	`decision` text NOT NULL,
	`justification` text,
	`value` real,
	`by_user_id` integer NOT NULL,
	`at` integer NOT NULL,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`analysis_id`) REFERENCES `analyses`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	CONSTRAINT "flag_dispositions_decision_known" CHECK("decision" in ('waived', 'must_fix')),
	CONSTRAINT "flag_dispositions_waiver_justified" CHECK("decision" <> 'waived' or length(trim(coalesce("justification", ''))) > 0)
);
--> statement-breakpoint
CREATE INDEX `flag_dispositions_revision` ON `flag_dispositions` (`revision_id`,`flag_key`);--> statement-breakpoint
CREATE TABLE `notification_preferences` (
	`workspace_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	`kind` text NOT NULL,
	`email` integer NOT NULL,
	`updated_at` integer NOT NULL,
	PRIMARY KEY(`workspace_id`, `user_id`, `kind`),
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `notifications` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	`kind` text NOT NULL,
	`revision_id` integer,
	`actor_user_id` integer,
	`summary` text NOT NULL,
	`details` text DEFAULT '{}' NOT NULL,
	`created_at` integer NOT NULL,
	`read_at` integer,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`actor_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE set null,
	CONSTRAINT "notifications_kind_known" CHECK("kind" in ('review_requested', 'changes_requested', 'cleared', 'mentioned'))
);
--> statement-breakpoint
CREATE INDEX `notifications_user` ON `notifications` (`user_id`,`workspace_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `review_comments` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`workspace_id` integer NOT NULL,
	`revision_id` integer NOT NULL,
	`parent_id` integer,
	`author_user_id` integer NOT NULL,
	`body` text NOT NULL,
	`segment_id` text,
	`x_m` real,
	`y_m` real,
	`mentions` text DEFAULT '[]' NOT NULL,
	`created_at` integer NOT NULL,
	`resolved_at` integer,
	`resolved_by_user_id` integer,
	FOREIGN KEY (`workspace_id`) REFERENCES `workspaces`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`revision_id`) REFERENCES `revisions`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`author_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`resolved_by_user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `review_comments_revision` ON `review_comments` (`revision_id`,`created_at`);--> statement-breakpoint
-- Decisions on record: the database refuses UPDATE and DELETE of dispositions and clearances.
CREATE TRIGGER `flag_dispositions_no_update` BEFORE UPDATE ON `flag_dispositions`
BEGIN
  SELECT RAISE(ABORT, 'flag_dispositions is append-only');
END;
--> statement-breakpoint
CREATE TRIGGER `flag_dispositions_no_delete` BEFORE DELETE ON `flag_dispositions`
BEGIN
  SELECT RAISE(ABORT, 'flag_dispositions is append-only');
END;
--> statement-breakpoint
CREATE TRIGGER `clearances_no_update` BEFORE UPDATE ON `clearances`
BEGIN
  SELECT RAISE(ABORT, 'clearances are immutable');
END;
--> statement-breakpoint
CREATE TRIGGER `clearances_no_delete` BEFORE DELETE ON `clearances`
BEGIN
  SELECT RAISE(ABORT, 'clearances are immutable');
END;

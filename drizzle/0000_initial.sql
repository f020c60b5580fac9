CREATE TABLE `api_tokens` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`name` text NOT NULL,
	`scope` text NOT NULL,
	`token_hash` text NOT NULL,
	`prefix` text NOT NULL,
	`created_at` integer NOT NULL,
	`expires_at` integer,
	`last_used_at` integer,
	`revoked_at` integer,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `api_tokens_hash_unique` ON `api_tokens` (`token_hash`);--> statement-breakpoint
CREATE INDEX `api_tokens_user_idx` ON `api_tokens` (`user_id`);--> statement-breakpoint
CREATE TABLE `audit_log` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`actor_id` integer,
	`action` text NOT NULL,
	`target` text,
	`details` text,
	`created_at` integer DEFAULT (unixepoch() * 1000) NOT NULL,
	FOREIGN KEY (`actor_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `audit_created_idx` ON `audit_log` (`created_at`);--> statement-breakpoint
CREATE TABLE `dataset_rows` (
	`id` integer PRIMARY KEY NOT NULL,
	`cells` text NOT NULL
);
--> statement-breakpoint
CREATE TABLE `dataset_shares` (
	`dataset_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	PRIMARY KEY(`dataset_id`, `user_id`),
	FOREIGN KEY (`dataset_id`) REFERENCES `datasets`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `datasets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`owner_id` integer NOT NULL,
	`name` text NOT NULL,
	`file_name` text,
	`columns` text NOT NULL,
	`rows` integer NOT NULL,
	`visibility` text DEFAULT 'private' NOT NULL,
	`sha256` text NOT NULL,
	`created_at` integer NOT NULL,
	`deleted_at` integer,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `datasets_owner_idx` ON `datasets` (`owner_id`);--> statement-breakpoint
CREATE TABLE `fits` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`owner_id` integer NOT NULL,
	`source_kind` text NOT NULL,
	`source_id` integer NOT NULL,
	`model` text NOT NULL,
	`request` text NOT NULL,
	`result` text,
	`status` text NOT NULL,
	`progress` real DEFAULT 0 NOT NULL,
	`error` text,
	`app_version` text NOT NULL,
	`source_model_version` text,
	`created_at` integer NOT NULL,
	`finished_at` integer,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `fits_source_idx` ON `fits` (`source_kind`,`source_id`);--> statement-breakpoint
CREATE INDEX `fits_owner_idx` ON `fits` (`owner_id`);--> statement-breakpoint
CREATE TABLE `invitations` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`email` text NOT NULL,
	`role` text NOT NULL,
	`token_hash` text NOT NULL,
	`invited_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	`expires_at` integer NOT NULL,
	`accepted_at` integer,
	`revoked_at` integer,
	FOREIGN KEY (`invited_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `invitations_hash_unique` ON `invitations` (`token_hash`);--> statement-breakpoint
CREATE TABLE `mail_messages` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`message_id` text,
	`from` text NOT NULL,
	`to` text NOT NULL,
	`subject` text NOT NULL,
	`text` text NOT NULL,
	`html` text,
	`received_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `password_resets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`token_hash` text NOT NULL,
	`created_at` integer NOT NULL,
	`expires_at` integer NOT NULL,
	`used_at` integer,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `password_resets_hash_unique` ON `password_resets` (`token_hash`);--> statement-breakpoint
CREATE TABLE `results` (
	`id` integer PRIMARY KEY NOT NULL,
	`flags` integer NOT NULL,
	`c0` real,
	`c1` real,
	`c2` real,
	`c3` real,
	`c4` real,
	`c5` real,
	`c6` real,
	`c7` real,
	`c8` real,
	`c9` real,
	`c10` real,
	`c11` real,
	`c12` real,
	`c13` real,
	`c14` real,
	`c15` real,
	`c16` real,
	`c17` real,
	`c18` real,
	`c19` real,
	`c20` real,
	`c21` real,
	`c22` real,
	`c23` real,
	`c24` real,
	`c25` real,
	`c26` real,
	`c27` real,
	`c28` real,
	`c29` real,
	`c30` real,
	`c31` real,
	`c32` real,
	`c33` real,
	`c34` real,
	`c35` real,
	`c36` real,
	`c37` real,
	`c38` real,
	`c39` real,
	`c40` real,
	`c41` real,
	`c42` real,
	`c43` real,
	`c44` real,
	`c45` real,
	`c46` real,
	`c47` real,
	`c48` real,
	`c49` real,
	`c50` real,
	`c51` real,
	`c52` real,
	`c53` real,
	`c54` real,
	`c55` real,
	`c56` real,
	`c57` real,
	`c58` real,
	`c59` real,
	`c60` real,
	`c61` real,
	`c62` real,
	`c63` real
);
--> statement-breakpoint
CREATE TABLE `role_quotas` (
	`role` text PRIMARY KEY NOT NULL,
	`max_points_per_sweep` integer NOT NULL,
	`max_running_sweeps` integer NOT NULL,
	`max_points_per_30_days` integer NOT NULL,
	`max_stored_points` integer NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `sweep_chunks` (
	`sweep_id` integer NOT NULL,
	`chunk_index` integer NOT NULL,
	`i0` integer NOT NULL,
	`i1` integer NOT NULL,
	`state` text NOT NULL,
	`attempts` integer DEFAULT 0 NOT NULL,
	`worker_id` text,
	`compute_ms` real,
	`error` text,
	`updated_at` integer NOT NULL,
	PRIMARY KEY(`sweep_id`, `chunk_index`),
	FOREIGN KEY (`sweep_id`) REFERENCES `sweeps`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `sweep_chunks_state_idx` ON `sweep_chunks` (`state`);--> statement-breakpoint
CREATE TABLE `sweep_shares` (
	`sweep_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	PRIMARY KEY(`sweep_id`, `user_id`),
	FOREIGN KEY (`sweep_id`) REFERENCES `sweeps`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `sweep_shares_user_idx` ON `sweep_shares` (`user_id`);--> statement-breakpoint
CREATE TABLE `sweep_tags` (
	`sweep_id` integer NOT NULL,
	`tag` text NOT NULL,
	PRIMARY KEY(`sweep_id`, `tag`),
	FOREIGN KEY (`sweep_id`) REFERENCES `sweeps`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE INDEX `sweep_tags_tag_idx` ON `sweep_tags` (`tag`);--> statement-breakpoint
CREATE TABLE `sweeps` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`owner_id` integer NOT NULL,
	`name` text NOT NULL,
	`model` text NOT NULL,
	`model_version` text NOT NULL,
	`app_version` text NOT NULL,
	`status` text NOT NULL,
	`definition` text NOT NULL,
	`columns` text NOT NULL,
	`visibility` text DEFAULT 'private' NOT NULL,
	`points` integer NOT NULL,
	`points_done` integer DEFAULT 0 NOT NULL,
	`chunk_count` integer NOT NULL,
	`invalid_points` integer DEFAULT 0 NOT NULL,
	`flag_counts` text DEFAULT '{}' NOT NULL,
	`compute_ms` real DEFAULT 0 NOT NULL,
	`error` text,
	`created_at` integer NOT NULL,
	`started_at` integer,
	`finished_at` integer,
	`archived_at` integer,
	`archive_sha256` text,
	`archive_bytes` integer,
	`archive_file` text,
	`deleted_at` integer,
	FOREIGN KEY (`owner_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `sweeps_owner_idx` ON `sweeps` (`owner_id`);--> statement-breakpoint
CREATE INDEX `sweeps_status_idx` ON `sweeps` (`status`);--> statement-breakpoint
CREATE INDEX `sweeps_created_idx` ON `sweeps` (`created_at`);--> statement-breakpoint
CREATE TABLE `user_quotas` (
	`user_id` integer PRIMARY KEY NOT NULL,
	`max_points_per_sweep` integer,
	`max_running_sweeps` integer,
	`max_points_per_30_days` integer,
	`max_stored_points` integer,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `users` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`role` text NOT NULL,
	`password_hash` text NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	`failed_logins` integer DEFAULT 0 NOT NULL,
	`locked_until` integer,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);
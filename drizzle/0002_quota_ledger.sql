CREATE TABLE `quota_ledger` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`sweep_id` integer,
	`points` integer NOT NULL,
	`charged_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `quota_ledger_user_time_idx` ON `quota_ledger` (`user_id`,`charged_at`);--> statement-breakpoint
-- Backfill: every submitted sweep still present is charged at its creation time, as the usage query counted it before.
INSERT INTO `quota_ledger` (`user_id`, `sweep_id`, `points`, `charged_at`) SELECT `owner_id`, `id`, `points`, `created_at` FROM `sweeps` WHERE `status` <> 'draft' AND `deleted_at` IS NULL;

CREATE TABLE `sheet_roles` (
	`sheet_id` text NOT NULL,
	`user_id` text NOT NULL,
	`role` text NOT NULL,
	`via_lock` integer DEFAULT false NOT NULL,
	`set_by` text NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	PRIMARY KEY(`sheet_id`, `user_id`),
	FOREIGN KEY (`sheet_id`) REFERENCES `sheets`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`set_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `sheet_roles_user_idx` ON `sheet_roles` (`user_id`);--> statement-breakpoint
-- A lock's list of who may still edit becomes their editor role on that sheet, named by the lock
-- (set by the locker, dated as the lock). The locker was always first on the list. Only members who
-- could edit then: a listed member since made a viewer could not, and must not start now.
INSERT OR IGNORE INTO `sheet_roles` (`sheet_id`, `user_id`, `role`, `via_lock`, `set_by`, `created_at`)
SELECT l.`sheet_id`, e.`value`, 'editor', 1, l.`locked_by`, l.`created_at`
FROM `sheet_locks` l
JOIN json_each(l.`editors`) e
JOIN `sheets` s ON s.`id` = l.`sheet_id`
JOIN `workbook_members` m ON m.`workbook_id` = s.`workbook_id` AND m.`user_id` = e.`value` AND m.`role` <> 'viewer';--> statement-breakpoint
ALTER TABLE `sheet_locks` DROP COLUMN `editors`;
CREATE TABLE `account_tokens` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`purpose` text NOT NULL,
	`email` text NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` integer NOT NULL,
	`used_at` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `account_tokens_token_hash_unique` ON `account_tokens` (`token_hash`);--> statement-breakpoint
CREATE INDEX `account_tokens_user_idx` ON `account_tokens` (`user_id`);--> statement-breakpoint
ALTER TABLE `users` ADD `email_verified_at` integer;--> statement-breakpoint
ALTER TABLE `users` ADD `config_promoted_at` integer;--> statement-breakpoint
-- Accounts that existed before verification: site admins and members of workbooks shared with
-- someone else were already trusted by people who know them, so they count as verified; everyone
-- else is asked to verify at their next sign-in (the app shows the banner and resends on request).
UPDATE `users` SET `email_verified_at` = (unixepoch('subsec') * 1000)
WHERE `site_role` = 'admin'
   OR `id` IN (SELECT `m`.`user_id` FROM `workbook_members` `m`
               WHERE (SELECT count(*) FROM `workbook_members` `o` WHERE `o`.`workbook_id` = `m`.`workbook_id`) > 1);--> statement-breakpoint
-- A promotion by ORBITAB_ADMIN_EMAIL that already happened is not repeated, so a demotion sticks.
UPDATE `users` SET `config_promoted_at` = (SELECT min(`a`.`created_at`) FROM `audit_log` `a` WHERE `a`.`action` = 'site.user_promoted_by_config' AND `a`.`actor_id` = `users`.`id`)
WHERE `id` IN (SELECT `actor_id` FROM `audit_log` WHERE `action` = 'site.user_promoted_by_config');--> statement-breakpoint
-- Addresses compare without regard to case; stored ones become lower case where that joins no two accounts.
UPDATE `users` SET `email` = lower(`email`)
WHERE `email` <> lower(`email`) AND (SELECT count(*) FROM `users` `u` WHERE lower(`u`.`email`) = lower(`users`.`email`)) = 1;--> statement-breakpoint
UPDATE `invitations` SET `email` = lower(`email`) WHERE `email` <> lower(`email`);

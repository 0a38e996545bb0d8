CREATE TABLE `structure_results` (
	`workbook_id` text NOT NULL,
	`key` text NOT NULL,
	`result` text NOT NULL,
	`compute_ms` integer NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	PRIMARY KEY(`workbook_id`, `key`),
	FOREIGN KEY (`workbook_id`) REFERENCES `workbooks`(`id`) ON UPDATE no action ON DELETE cascade
);

CREATE TABLE `revision_values` (
	`workbook_id` text NOT NULL,
	`revision` integer NOT NULL,
	`values_gzip` blob NOT NULL,
	`extras` text NOT NULL,
	`volatile_formulas` integer DEFAULT 0 NOT NULL,
	`computed_ms` integer DEFAULT 0 NOT NULL,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	PRIMARY KEY(`workbook_id`, `revision`),
	FOREIGN KEY (`workbook_id`) REFERENCES `workbooks`(`id`) ON UPDATE no action ON DELETE cascade
);

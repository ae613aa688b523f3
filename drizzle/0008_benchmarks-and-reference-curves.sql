CREATE TABLE `benchmarks` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`project_id` integer NOT NULL,
	`build_id` integer,
	`reference_curve_id` integer,
	`note` text DEFAULT '' NOT NULL,
	`set_by` integer,
	`set_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`reference_curve_id`) REFERENCES `reference_curves`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`set_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `benchmarks_project_id_unique` ON `benchmarks` (`project_id`);--> statement-breakpoint
CREATE TABLE `reference_curves` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`project_id` integer NOT NULL,
	`file_id` integer,
	`label` text NOT NULL,
	`source` text NOT NULL,
	`source_date` text,
	`conditions` text NOT NULL,
	`loading_mg_cm2` real,
	`metal_loading_mg_cm2` real,
	`area_cm2` real,
	`notes` text DEFAULT '' NOT NULL,
	`mapping` text,
	`point_count` integer NOT NULL,
	`points` blob NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`file_id`) REFERENCES `files`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `reference_curves_project_idx` ON `reference_curves` (`project_id`);--> statement-breakpoint
ALTER TABLE `files` ADD `lot_id` integer REFERENCES lots(id);
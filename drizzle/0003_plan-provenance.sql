CREATE TABLE `designs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`project_id` integer NOT NULL,
	`kind` text NOT NULL,
	`seed` integer,
	`settings` text NOT NULL,
	`run_count` integer NOT NULL,
	`note` text DEFAULT '' NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `designs_project_idx` ON `designs` (`project_id`);--> statement-breakpoint
ALTER TABLE `builds` ADD `design_id` integer REFERENCES designs(id);--> statement-breakpoint
ALTER TABLE `builds` ADD `planned_on` text;--> statement-breakpoint
ALTER TABLE `builds` ADD `plan_reason` text;
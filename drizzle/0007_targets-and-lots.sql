CREATE TABLE `lots` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`project_id` integer NOT NULL,
	`name` text NOT NULL,
	`maker` text DEFAULT '' NOT NULL,
	`batch_size_g` real,
	`made_on` text,
	`metal_wt_pct` real,
	`notes` text DEFAULT '' NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_at` text,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `lots_project_name` ON `lots` (`project_id`,`name`);--> statement-breakpoint
CREATE TABLE `targets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`project_id` integer NOT NULL,
	`metric` text NOT NULL,
	`comparator` text NOT NULL,
	`value` real NOT NULL,
	`unit` text NOT NULL,
	`basis` text,
	`conditions` text DEFAULT '' NOT NULL,
	`due_date` text,
	`name` text DEFAULT '' NOT NULL,
	`created_by` integer,
	`created_at` text DEFAULT (strftime('%Y-%m-%dT%H:%M:%fZ','now')) NOT NULL,
	`updated_at` text,
	FOREIGN KEY (`project_id`) REFERENCES `projects`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `targets_project_idx` ON `targets` (`project_id`);--> statement-breakpoint
ALTER TABLE `builds` ADD `lot_id` integer REFERENCES lots(id);--> statement-breakpoint
INSERT INTO `lots` (`project_id`, `name`, `notes`) SELECT DISTINCT `project_id`, trim(`catalyst_lot`), 'recorded from the free-text lot of its builds' FROM `builds` WHERE `catalyst_lot` IS NOT NULL AND trim(`catalyst_lot`) <> '';--> statement-breakpoint
UPDATE `builds` SET `lot_id` = (SELECT `lots`.`id` FROM `lots` WHERE `lots`.`project_id` = `builds`.`project_id` AND `lots`.`name` = trim(`builds`.`catalyst_lot`)) WHERE `catalyst_lot` IS NOT NULL;

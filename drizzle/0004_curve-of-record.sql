ALTER TABLE `curves` ADD `is_record` integer DEFAULT false NOT NULL;--> statement-breakpoint
-- Existing builds keep the values they show today: the curve that provides them becomes the record.
-- Polarization: the latest curve measured at the project's current reference point.
UPDATE `curves` SET `is_record` = 1 WHERE `id` IN (
  SELECT max(c.`id`) FROM `curves` c
    JOIN `builds` b ON b.`id` = c.`build_id`
    JOIN `projects` p ON p.`id` = b.`project_id`
  WHERE c.`kind` = 'polarization' AND c.`metrics_version` = p.`metrics_version`
  GROUP BY c.`build_id`
);--> statement-breakpoint
-- Polarization curves of builds with none at the current reference point: the latest one.
UPDATE `curves` SET `is_record` = 1 WHERE `id` IN (
  SELECT max(c.`id`) FROM `curves` c
  WHERE c.`kind` = 'polarization'
    AND c.`build_id` NOT IN (SELECT `build_id` FROM `curves` WHERE `kind` = 'polarization' AND `is_record` = 1)
  GROUP BY c.`build_id`
);--> statement-breakpoint
-- Durability logs and holds: the latest of each kind.
UPDATE `curves` SET `is_record` = 1 WHERE `id` IN (
  SELECT max(`id`) FROM `curves` WHERE `kind` IN ('durability', 'hold') GROUP BY `build_id`, `kind`
);--> statement-breakpoint
CREATE UNIQUE INDEX `curves_record_idx` ON `curves` (`build_id`,`kind`) WHERE "curves"."is_record" = 1;

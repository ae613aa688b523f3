CREATE TABLE `curve_point_chunks` (
	`curve_id` integer NOT NULL,
	`seq` integer NOT NULL,
	`bytes` blob NOT NULL,
	PRIMARY KEY(`curve_id`, `seq`),
	FOREIGN KEY (`curve_id`) REFERENCES `curves`(`id`) ON UPDATE no action ON DELETE cascade
);

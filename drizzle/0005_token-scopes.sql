ALTER TABLE `api_tokens` ADD `scope` text DEFAULT 'full' NOT NULL;--> statement-breakpoint
ALTER TABLE `api_tokens` ADD `parent_token_id` integer REFERENCES api_tokens(id);
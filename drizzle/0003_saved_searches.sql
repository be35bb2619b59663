CREATE TABLE `saved_search_hits` (
	`saved_search_id` text NOT NULL,
	`listing_id` text NOT NULL,
	`notified_at` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	PRIMARY KEY(`saved_search_id`, `listing_id`),
	FOREIGN KEY (`saved_search_id`) REFERENCES `saved_searches`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`listing_id`) REFERENCES `listings`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE TABLE `saved_searches` (
	`id` text PRIMARY KEY NOT NULL,
	`user_id` text NOT NULL,
	`name` text NOT NULL,
	`mode` text NOT NULL,
	`query` text NOT NULL,
	`unsubscribe_token_hash` text NOT NULL,
	`active` integer DEFAULT true NOT NULL,
	`last_notified_at` integer,
	`created_at` integer DEFAULT (unixepoch('subsec') * 1000) NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `saved_searches_unsubscribe_token_hash_unique` ON `saved_searches` (`unsubscribe_token_hash`);--> statement-breakpoint
CREATE INDEX `saved_searches_user_idx` ON `saved_searches` (`user_id`);--> statement-breakpoint
CREATE INDEX `saved_searches_active_idx` ON `saved_searches` (`active`);
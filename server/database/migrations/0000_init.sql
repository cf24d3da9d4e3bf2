CREATE TABLE `as_built_checks` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`blueprint_id` integer NOT NULL,
	`scan_id` integer NOT NULL,
	`run_id` integer,
	`tolerance_nm` real NOT NULL,
	`result` text NOT NULL,
	`fidelity` real NOT NULL,
	`rms_nm` real,
	`created_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`blueprint_id`) REFERENCES `blueprints`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`scan_id`) REFERENCES `scans`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`run_id`) REFERENCES `build_runs`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE TABLE `audit_log` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer,
	`user_id` integer,
	`action` text NOT NULL,
	`target` text DEFAULT '' NOT NULL,
	`detail` text,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `audit_lab` ON `audit_log` (`lab_id`,`created_at`);--> statement-breakpoint
CREATE TABLE `blueprints` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`sample_id` integer NOT NULL,
	`build_id` integer,
	`lineage` integer NOT NULL,
	`version` integer NOT NULL,
	`name` text NOT NULL,
	`surface` text NOT NULL,
	`site` text NOT NULL,
	`min_spacing_nm` real,
	`shapes` text NOT NULL,
	`site_count` integer DEFAULT 0 NOT NULL,
	`created_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`sample_id`) REFERENCES `samples`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `blueprints_lineage_version` ON `blueprints` (`lineage`,`version`);--> statement-breakpoint
CREATE INDEX `blueprints_sample` ON `blueprints` (`sample_id`);--> statement-breakpoint
CREATE TABLE `build_runs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`build_id` integer,
	`route_id` integer NOT NULL,
	`current_route_id` integer NOT NULL,
	`state` text DEFAULT 'open' NOT NULL,
	`params` text DEFAULT '{}' NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`started_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	`closed_at` integer,
	`closed_by` integer,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`route_id`) REFERENCES `routes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`current_route_id`) REFERENCES `routes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`started_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`closed_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `build_runs_lab` ON `build_runs` (`lab_id`);--> statement-breakpoint
CREATE TABLE `builds` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`sample_id` integer NOT NULL,
	`name` text NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`archived_at` integer,
	`created_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`sample_id`) REFERENCES `samples`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `builds_sample` ON `builds` (`sample_id`);--> statement-breakpoint
CREATE INDEX `builds_lab` ON `builds` (`lab_id`);--> statement-breakpoint
CREATE TABLE `invites` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`email` text NOT NULL,
	`role` text NOT NULL,
	`token_hash` text NOT NULL,
	`invited_by` integer NOT NULL,
	`expires_at` integer NOT NULL,
	`accepted_at` integer,
	`accepted_by` integer,
	`revoked_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`invited_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`accepted_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `invites_token` ON `invites` (`token_hash`);--> statement-breakpoint
CREATE INDEX `invites_lab` ON `invites` (`lab_id`);--> statement-breakpoint
CREATE TABLE `labs` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`name` text NOT NULL,
	`settings` text DEFAULT '{}' NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE TABLE `lattice_fits` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`scan_id` integer NOT NULL,
	`version` integer NOT NULL,
	`surface` text NOT NULL,
	`site` text NOT NULL,
	`source` text NOT NULL,
	`locked` integer DEFAULT false NOT NULL,
	`result` text NOT NULL,
	`residual_nm` real,
	`created_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`scan_id`) REFERENCES `scans`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `lattice_fits_scan_version` ON `lattice_fits` (`scan_id`,`version`);--> statement-breakpoint
CREATE TABLE `logbook_entries` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`run_id` integer NOT NULL,
	`seq` integer NOT NULL,
	`route_id` integer NOT NULL,
	`move_index` integer NOT NULL,
	`outcome` text NOT NULL,
	`params` text DEFAULT '{}' NOT NULL,
	`position` text,
	`note` text DEFAULT '' NOT NULL,
	`supersedes` integer,
	`idempotency_key` text NOT NULL,
	`author_id` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`run_id`) REFERENCES `build_runs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`route_id`) REFERENCES `routes`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`author_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `logbook_run_seq` ON `logbook_entries` (`run_id`,`seq`);--> statement-breakpoint
CREATE UNIQUE INDEX `logbook_idempotency` ON `logbook_entries` (`run_id`,`idempotency_key`);--> statement-breakpoint
CREATE TABLE `login_attempts` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`key` text NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE INDEX `login_attempts_key` ON `login_attempts` (`key`,`created_at`);--> statement-breakpoint
CREATE TABLE `mark_sets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`scan_id` integer NOT NULL,
	`version` integer NOT NULL,
	`source` text NOT NULL,
	`params` text,
	`marks` text NOT NULL,
	`count` integer NOT NULL,
	`created_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`scan_id`) REFERENCES `scans`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE UNIQUE INDEX `mark_sets_scan_version` ON `mark_sets` (`scan_id`,`version`);--> statement-breakpoint
CREATE TABLE `memberships` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`user_id` integer NOT NULL,
	`role` text NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `memberships_lab_user` ON `memberships` (`lab_id`,`user_id`);--> statement-breakpoint
CREATE INDEX `memberships_user` ON `memberships` (`user_id`);--> statement-breakpoint
CREATE TABLE `password_resets` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`user_id` integer NOT NULL,
	`token_hash` text NOT NULL,
	`expires_at` integer NOT NULL,
	`used_at` integer,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`user_id`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE cascade
);
--> statement-breakpoint
CREATE UNIQUE INDEX `password_resets_token` ON `password_resets` (`token_hash`);--> statement-breakpoint
CREATE TABLE `routes` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`blueprint_id` integer NOT NULL,
	`scan_id` integer,
	`parent_id` integer,
	`options` text NOT NULL,
	`result` text NOT NULL,
	`move_count` integer NOT NULL,
	`total_length_nm` real NOT NULL,
	`solver_ms` real NOT NULL,
	`created_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`blueprint_id`) REFERENCES `blueprints`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`scan_id`) REFERENCES `scans`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `routes_blueprint` ON `routes` (`blueprint_id`);--> statement-breakpoint
CREATE TABLE `samples` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`name` text NOT NULL,
	`surface` text NOT NULL,
	`adsorbate` text NOT NULL,
	`temperature_K` real NOT NULL,
	`notes` text DEFAULT '' NOT NULL,
	`surface_state` text,
	`archived_at` integer,
	`created_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	`updated_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `samples_lab` ON `samples` (`lab_id`);--> statement-breakpoint
CREATE TABLE `scans` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`lab_id` integer NOT NULL,
	`sample_id` integer NOT NULL,
	`build_id` integer,
	`purpose` text DEFAULT 'plan' NOT NULL,
	`filename` text NOT NULL,
	`format` text NOT NULL,
	`storage_key` text NOT NULL,
	`grid_key` text,
	`bytes` integer NOT NULL,
	`width_px` integer NOT NULL,
	`height_px` integer NOT NULL,
	`size_x_nm` real NOT NULL,
	`size_y_nm` real NOT NULL,
	`offset_x_nm` real DEFAULT 0 NOT NULL,
	`offset_y_nm` real DEFAULT 0 NOT NULL,
	`rotation_deg` real DEFAULT 0 NOT NULL,
	`bias_V` real,
	`setpoint_A` real,
	`z_scale` text,
	`processing` text DEFAULT '{}' NOT NULL,
	`taken_at` integer,
	`notes` text DEFAULT '' NOT NULL,
	`created_by` integer NOT NULL,
	`created_at` integer NOT NULL,
	FOREIGN KEY (`lab_id`) REFERENCES `labs`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`sample_id`) REFERENCES `samples`(`id`) ON UPDATE no action ON DELETE cascade,
	FOREIGN KEY (`build_id`) REFERENCES `builds`(`id`) ON UPDATE no action ON DELETE no action,
	FOREIGN KEY (`created_by`) REFERENCES `users`(`id`) ON UPDATE no action ON DELETE no action
);
--> statement-breakpoint
CREATE INDEX `scans_sample` ON `scans` (`sample_id`);--> statement-breakpoint
CREATE INDEX `scans_build` ON `scans` (`build_id`);--> statement-breakpoint
CREATE TABLE `users` (
	`id` integer PRIMARY KEY AUTOINCREMENT NOT NULL,
	`email` text NOT NULL,
	`name` text NOT NULL,
	`password_hash` text NOT NULL,
	`created_at` integer NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX `users_email_unique` ON `users` (`email`);
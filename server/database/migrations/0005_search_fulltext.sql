-- FULLTEXT indexes for the search fallback that answers while a team's in-memory index is being built.
ALTER TABLE `mark_inscriptions` ADD FULLTEXT INDEX `mark_inscriptions_text_ft` (`text`);--> statement-breakpoint
ALTER TABLE `marks` ADD FULLTEXT INDEX `marks_title_ft` (`title`);--> statement-breakpoint
ALTER TABLE `makers` ADD FULLTEXT INDEX `makers_name_ft` (`name`);

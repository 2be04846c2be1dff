ALTER TABLE "jobs" DROP CONSTRAINT "jobs_care_token_hash_unique";--> statement-breakpoint
ALTER TABLE "care_reminders" ADD COLUMN "token_hash" text;--> statement-breakpoint
ALTER TABLE "jobs" DROP COLUMN "care_token_hash";--> statement-breakpoint
ALTER TABLE "care_reminders" ADD CONSTRAINT "care_reminders_token_hash_unique" UNIQUE("token_hash");
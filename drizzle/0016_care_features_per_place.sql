DROP INDEX "property_features_job_kind_idx";--> statement-breakpoint
ALTER TABLE "property_features" ADD COLUMN "job_seq" integer;--> statement-breakpoint
-- Features recorded from jobs before a job could hold two of a kind: numbered in the order they were recorded.
UPDATE "property_features" AS f SET "job_seq" = n.seq - 1
FROM (
	SELECT "id", row_number() OVER (PARTITION BY "job_id" ORDER BY "created_at", "id") AS seq
	FROM "property_features" WHERE "job_id" IS NOT NULL
) AS n
WHERE f."id" = n."id";--> statement-breakpoint
CREATE UNIQUE INDEX "property_features_job_seq_idx" ON "property_features" USING btree ("job_id","job_seq");

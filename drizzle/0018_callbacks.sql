CREATE TABLE "callback_links" (
	"job_id" text PRIMARY KEY NOT NULL,
	"token_hash" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "callback_links_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "callback_photos" (
	"callback_id" text NOT NULL,
	"photo_id" text NOT NULL,
	CONSTRAINT "callback_photos_callback_id_photo_id_pk" PRIMARY KEY("callback_id","photo_id")
);
--> statement-breakpoint
CREATE TABLE "callbacks" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"description" text NOT NULL,
	"status" text DEFAULT 'reported' NOT NULL,
	"in_warranty" boolean NOT NULL,
	"warranty_ends_on" date,
	"reported_on" date NOT NULL,
	"assigned_to" text,
	"scheduled_on" date,
	"closing_notes" text DEFAULT '' NOT NULL,
	"closed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "callback_links" ADD CONSTRAINT "callback_links_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "callback_photos" ADD CONSTRAINT "callback_photos_callback_id_callbacks_id_fk" FOREIGN KEY ("callback_id") REFERENCES "public"."callbacks"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "callback_photos" ADD CONSTRAINT "callback_photos_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "callbacks" ADD CONSTRAINT "callbacks_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "callbacks" ADD CONSTRAINT "callbacks_assigned_to_users_id_fk" FOREIGN KEY ("assigned_to") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "callbacks_job_idx" ON "callbacks" USING btree ("job_id");--> statement-breakpoint
CREATE INDEX "callbacks_status_idx" ON "callbacks" USING btree ("status","scheduled_on");
CREATE TABLE "calendar_feeds" (
	"user_id" text PRIMARY KEY NOT NULL,
	"token_hash" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "calendar_feeds_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "care_checkouts" (
	"id" text PRIMARY KEY NOT NULL,
	"subscription_id" text,
	"service_visit_id" text,
	"covers_through" date,
	"amount_cents" integer NOT NULL,
	"currency" text NOT NULL,
	"provider_session_id" text NOT NULL,
	"url" text NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"problem" text,
	"paid_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "care_checkouts_provider_session_id_unique" UNIQUE("provider_session_id")
);
--> statement-breakpoint
CREATE TABLE "care_crew_days" (
	"id" text PRIMARY KEY NOT NULL,
	"day" date NOT NULL,
	"crew_lead_id" text NOT NULL,
	"start_minute" integer NOT NULL,
	"end_minute" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "care_links" (
	"token_hash" text PRIMARY KEY NOT NULL,
	"property_id" text NOT NULL,
	"service_visit_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "care_plans" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"terms" text DEFAULT '' NOT NULL,
	"visits" jsonb NOT NULL,
	"prices" jsonb NOT NULL,
	"pay_yearly" boolean DEFAULT true NOT NULL,
	"pay_per_visit" boolean DEFAULT true NOT NULL,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "care_season_settings" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"first_frost" text DEFAULT '10-15' NOT NULL,
	"shutdown_days" integer DEFAULT 42 NOT NULL,
	"spring_start" text DEFAULT '04-15' NOT NULL,
	"spring_days" integer DEFAULT 45 NOT NULL,
	"summer_start" text DEFAULT '06-15' NOT NULL,
	"summer_days" integer DEFAULT 60 NOT NULL,
	"depot_lat" double precision,
	"depot_lng" double precision,
	"speed_kmh" integer DEFAULT 40 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "care_subscriptions" (
	"id" text PRIMARY KEY NOT NULL,
	"plan_id" text NOT NULL,
	"property_id" text NOT NULL,
	"contact_id" text NOT NULL,
	"billing" text NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"feature_ids" text[] NOT NULL,
	"year_cents" integer NOT NULL,
	"typed_name" text NOT NULL,
	"accepted_at" timestamp with time zone NOT NULL,
	"ip_address" text,
	"starts_on" date NOT NULL,
	"renews_on" date NOT NULL,
	"paid_through" date,
	"cancelled_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "feature_photos" (
	"feature_id" text NOT NULL,
	"photo_id" text NOT NULL,
	CONSTRAINT "feature_photos_feature_id_photo_id_pk" PRIMARY KEY("feature_id","photo_id")
);
--> statement-breakpoint
CREATE TABLE "property_features" (
	"id" text PRIMARY KEY NOT NULL,
	"property_id" text NOT NULL,
	"job_id" text,
	"kind" text NOT NULL,
	"size" text NOT NULL,
	"pump" text DEFAULT '' NOT NULL,
	"lights" integer DEFAULT 0 NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"built_by" text DEFAULT 'us' NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "property_locations" (
	"property_id" text PRIMARY KEY NOT NULL,
	"lat" double precision NOT NULL,
	"lng" double precision NOT NULL,
	"source" text NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "service_visit_parts" (
	"id" text PRIMARY KEY NOT NULL,
	"service_visit_id" text NOT NULL,
	"sku" text NOT NULL,
	"name" text NOT NULL,
	"unit" text NOT NULL,
	"quantity" double precision NOT NULL,
	"unit_price_cents" integer NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "service_visit_photos" (
	"service_visit_id" text NOT NULL,
	"photo_id" text NOT NULL,
	CONSTRAINT "service_visit_photos_service_visit_id_photo_id_pk" PRIMARY KEY("service_visit_id","photo_id")
);
--> statement-breakpoint
CREATE TABLE "service_visits" (
	"id" text PRIMARY KEY NOT NULL,
	"subscription_id" text NOT NULL,
	"feature_id" text NOT NULL,
	"property_id" text NOT NULL,
	"kind" text NOT NULL,
	"season" text NOT NULL,
	"window_start" date NOT NULL,
	"window_end" date NOT NULL,
	"status" text DEFAULT 'due' NOT NULL,
	"day" date,
	"crew_day_id" text,
	"crew_lead_id" text,
	"route_order" integer,
	"minutes" integer NOT NULL,
	"price_cents" integer NOT NULL,
	"billed_per_visit" boolean NOT NULL,
	"checklist" jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"notified_day" date,
	"change_request" text,
	"change_requested_at" timestamp with time zone,
	"done_at" timestamp with time zone,
	"done_by" text,
	"paid_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "calendar_feeds" ADD CONSTRAINT "calendar_feeds_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_checkouts" ADD CONSTRAINT "care_checkouts_subscription_id_care_subscriptions_id_fk" FOREIGN KEY ("subscription_id") REFERENCES "public"."care_subscriptions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_checkouts" ADD CONSTRAINT "care_checkouts_service_visit_id_service_visits_id_fk" FOREIGN KEY ("service_visit_id") REFERENCES "public"."service_visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_crew_days" ADD CONSTRAINT "care_crew_days_crew_lead_id_users_id_fk" FOREIGN KEY ("crew_lead_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_links" ADD CONSTRAINT "care_links_property_id_properties_id_fk" FOREIGN KEY ("property_id") REFERENCES "public"."properties"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_links" ADD CONSTRAINT "care_links_service_visit_id_service_visits_id_fk" FOREIGN KEY ("service_visit_id") REFERENCES "public"."service_visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_subscriptions" ADD CONSTRAINT "care_subscriptions_plan_id_care_plans_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."care_plans"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_subscriptions" ADD CONSTRAINT "care_subscriptions_property_id_properties_id_fk" FOREIGN KEY ("property_id") REFERENCES "public"."properties"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "care_subscriptions" ADD CONSTRAINT "care_subscriptions_contact_id_contacts_id_fk" FOREIGN KEY ("contact_id") REFERENCES "public"."contacts"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "feature_photos" ADD CONSTRAINT "feature_photos_feature_id_property_features_id_fk" FOREIGN KEY ("feature_id") REFERENCES "public"."property_features"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "feature_photos" ADD CONSTRAINT "feature_photos_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "property_features" ADD CONSTRAINT "property_features_property_id_properties_id_fk" FOREIGN KEY ("property_id") REFERENCES "public"."properties"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "property_features" ADD CONSTRAINT "property_features_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "property_locations" ADD CONSTRAINT "property_locations_property_id_properties_id_fk" FOREIGN KEY ("property_id") REFERENCES "public"."properties"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visit_parts" ADD CONSTRAINT "service_visit_parts_service_visit_id_service_visits_id_fk" FOREIGN KEY ("service_visit_id") REFERENCES "public"."service_visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visit_parts" ADD CONSTRAINT "service_visit_parts_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visit_photos" ADD CONSTRAINT "service_visit_photos_service_visit_id_service_visits_id_fk" FOREIGN KEY ("service_visit_id") REFERENCES "public"."service_visits"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visit_photos" ADD CONSTRAINT "service_visit_photos_photo_id_photos_id_fk" FOREIGN KEY ("photo_id") REFERENCES "public"."photos"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visits" ADD CONSTRAINT "service_visits_subscription_id_care_subscriptions_id_fk" FOREIGN KEY ("subscription_id") REFERENCES "public"."care_subscriptions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visits" ADD CONSTRAINT "service_visits_feature_id_property_features_id_fk" FOREIGN KEY ("feature_id") REFERENCES "public"."property_features"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visits" ADD CONSTRAINT "service_visits_property_id_properties_id_fk" FOREIGN KEY ("property_id") REFERENCES "public"."properties"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visits" ADD CONSTRAINT "service_visits_crew_day_id_care_crew_days_id_fk" FOREIGN KEY ("crew_day_id") REFERENCES "public"."care_crew_days"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visits" ADD CONSTRAINT "service_visits_crew_lead_id_users_id_fk" FOREIGN KEY ("crew_lead_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "service_visits" ADD CONSTRAINT "service_visits_done_by_users_id_fk" FOREIGN KEY ("done_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "care_crew_days_day_lead_idx" ON "care_crew_days" USING btree ("day","crew_lead_id");--> statement-breakpoint
CREATE INDEX "care_links_property_idx" ON "care_links" USING btree ("property_id");--> statement-breakpoint
CREATE UNIQUE INDEX "care_subscriptions_one_per_property_idx" ON "care_subscriptions" USING btree ("property_id") WHERE "care_subscriptions"."status" <> 'cancelled';--> statement-breakpoint
CREATE INDEX "property_features_property_idx" ON "property_features" USING btree ("property_id");--> statement-breakpoint
CREATE UNIQUE INDEX "property_features_job_kind_idx" ON "property_features" USING btree ("job_id","kind");--> statement-breakpoint
CREATE INDEX "service_visit_parts_visit_idx" ON "service_visit_parts" USING btree ("service_visit_id");--> statement-breakpoint
CREATE UNIQUE INDEX "service_visits_once_idx" ON "service_visits" USING btree ("subscription_id","feature_id","kind","season");--> statement-breakpoint
CREATE INDEX "service_visits_day_idx" ON "service_visits" USING btree ("day","crew_lead_id");--> statement-breakpoint
CREATE INDEX "service_visits_season_idx" ON "service_visits" USING btree ("season","status");
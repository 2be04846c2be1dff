CREATE TYPE "public"."checkout_status" AS ENUM('open', 'paid', 'expired');--> statement-breakpoint
CREATE TYPE "public"."invoice_kind" AS ENUM('deposit', 'final');--> statement-breakpoint
CREATE TYPE "public"."payment_kind" AS ENUM('deposit', 'progress', 'final', 'refund');--> statement-breakpoint
CREATE TYPE "public"."payment_method" AS ENUM('card', 'cheque', 'cash', 'bank_transfer');--> statement-breakpoint
CREATE TABLE "checkout_requests" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"kind" "payment_kind" NOT NULL,
	"amount_cents" integer NOT NULL,
	"currency" text NOT NULL,
	"provider_session_id" text NOT NULL,
	"url" text NOT NULL,
	"status" "checkout_status" DEFAULT 'open' NOT NULL,
	"problem" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "checkout_requests_provider_session_id_unique" UNIQUE("provider_session_id")
);
--> statement-breakpoint
CREATE TABLE "invoice_counter" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"last" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "invoices" (
	"id" text PRIMARY KEY NOT NULL,
	"number" integer NOT NULL,
	"job_id" text NOT NULL,
	"kind" "invoice_kind" NOT NULL,
	"snapshot" jsonb NOT NULL,
	"total_cents" integer NOT NULL,
	"tax_cents" integer NOT NULL,
	"payments_cents" integer NOT NULL,
	"balance_due_cents" integer NOT NULL,
	"issued_at" timestamp with time zone DEFAULT now() NOT NULL,
	"due_on" date NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "invoices_number_unique" UNIQUE("number")
);
--> statement-breakpoint
CREATE TABLE "pay_links" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"token_hash" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "pay_links_token_hash_unique" UNIQUE("token_hash")
);
--> statement-breakpoint
CREATE TABLE "payment_events" (
	"event_id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"provider_session_id" text,
	"outcome" text NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "payments" (
	"id" text PRIMARY KEY NOT NULL,
	"job_id" text NOT NULL,
	"kind" "payment_kind" NOT NULL,
	"method" "payment_method" NOT NULL,
	"amount_cents" integer NOT NULL,
	"currency" text DEFAULT 'usd' NOT NULL,
	"provider_checkout_id" text,
	"reference" text,
	"received_on" date NOT NULL,
	"reason" text,
	"note" text DEFAULT '' NOT NULL,
	"recorded_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "payments_provider_checkout_id_unique" UNIQUE("provider_checkout_id"),
	CONSTRAINT "payments_refund_sign" CHECK (("payments"."kind" = 'refund' and "payments"."amount_cents" < 0 and "payments"."reason" is not null) or ("payments"."kind" <> 'refund' and "payments"."amount_cents" > 0))
);
--> statement-breakpoint
ALTER TABLE "checkout_requests" ADD CONSTRAINT "checkout_requests_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "invoices" ADD CONSTRAINT "invoices_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "pay_links" ADD CONSTRAINT "pay_links_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_job_id_jobs_id_fk" FOREIGN KEY ("job_id") REFERENCES "public"."jobs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payments" ADD CONSTRAINT "payments_recorded_by_users_id_fk" FOREIGN KEY ("recorded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "checkout_requests_job_idx" ON "checkout_requests" USING btree ("job_id","status");--> statement-breakpoint
CREATE UNIQUE INDEX "invoices_job_kind_idx" ON "invoices" USING btree ("job_id","kind");--> statement-breakpoint
CREATE INDEX "pay_links_job_idx" ON "pay_links" USING btree ("job_id");--> statement-breakpoint
CREATE INDEX "payments_job_idx" ON "payments" USING btree ("job_id","received_on");--> statement-breakpoint
CREATE UNIQUE INDEX "payments_reference_idx" ON "payments" USING btree ("job_id","method","reference");
CREATE TABLE "idempotency_records" (
	"api_key_id" uuid NOT NULL,
	"idempotency_key" text NOT NULL,
	"request_hash" text NOT NULL,
	"status" smallint NOT NULL,
	"body" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "idempotency_records_api_key_id_idempotency_key_pk" PRIMARY KEY("api_key_id","idempotency_key")
);
--> statement-breakpoint
CREATE TABLE "organization_monthly_usage" (
	"organization_id" uuid NOT NULL,
	"month" date NOT NULL,
	"calls" bigint DEFAULT 0 NOT NULL,
	CONSTRAINT "organization_monthly_usage_organization_id_month_pk" PRIMARY KEY("organization_id","month")
);
--> statement-breakpoint
CREATE TABLE "quota_notifications" (
	"organization_id" uuid NOT NULL,
	"month" date NOT NULL,
	"threshold_pct" smallint NOT NULL,
	"sent_at" timestamp with time zone DEFAULT now() NOT NULL,
	"details" jsonb DEFAULT '{}'::jsonb NOT NULL,
	CONSTRAINT "quota_notifications_organization_id_month_threshold_pct_pk" PRIMARY KEY("organization_id","month","threshold_pct")
);
--> statement-breakpoint
CREATE TABLE "rate_windows" (
	"organization_id" uuid NOT NULL,
	"window_start" timestamp with time zone NOT NULL,
	"calls" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "rate_windows_organization_id_window_start_pk" PRIMARY KEY("organization_id","window_start")
);
--> statement-breakpoint
CREATE TABLE "request_log" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"organization_id" uuid NOT NULL,
	"api_key_id" uuid,
	"method" text NOT NULL,
	"endpoint" text NOT NULL,
	"status" smallint NOT NULL,
	"duration_ms" integer NOT NULL,
	"request_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "api_keys" ADD COLUMN "replaced_by_key_id" uuid;--> statement-breakpoint
ALTER TABLE "idempotency_records" ADD CONSTRAINT "idempotency_records_api_key_id_api_keys_id_fk" FOREIGN KEY ("api_key_id") REFERENCES "public"."api_keys"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organization_monthly_usage" ADD CONSTRAINT "organization_monthly_usage_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "quota_notifications" ADD CONSTRAINT "quota_notifications_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "rate_windows" ADD CONSTRAINT "rate_windows_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "request_log" ADD CONSTRAINT "request_log_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "request_log" ADD CONSTRAINT "request_log_api_key_id_api_keys_id_fk" FOREIGN KEY ("api_key_id") REFERENCES "public"."api_keys"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "idempotency_records_created_idx" ON "idempotency_records" USING btree ("created_at");--> statement-breakpoint
CREATE INDEX "rate_windows_start_idx" ON "rate_windows" USING btree ("window_start");--> statement-breakpoint
CREATE INDEX "request_log_org_time_idx" ON "request_log" USING btree ("organization_id","created_at");
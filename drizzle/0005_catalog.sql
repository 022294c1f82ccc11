CREATE TABLE "catalog_hosts" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"sku" text NOT NULL,
	"name" text NOT NULL,
	"url" text,
	"dc_input_min_voltage_v" double precision,
	"dc_input_max_voltage_v" double precision,
	"dc_input_max_current_a" double precision,
	"dc_input_max_power_w" double precision,
	"dc_input_efficiency_pct" double precision,
	"battery_chemistry" text,
	"battery_series_cells" integer,
	"battery_capacity_ah" double precision,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "catalog_hosts_org_sku_key" UNIQUE("organization_id","sku"),
	CONSTRAINT "catalog_hosts_described" CHECK ("catalog_hosts"."dc_input_max_voltage_v" is not null or "catalog_hosts"."battery_chemistry" is not null)
);
--> statement-breakpoint
CREATE TABLE "catalog_packs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organization_id" uuid NOT NULL,
	"sku" text NOT NULL,
	"name" text NOT NULL,
	"url" text,
	"chemistry" text NOT NULL,
	"series_cells" integer NOT NULL,
	"capacity_ah" double precision NOT NULL,
	"internal_resistance_m_ohm" double precision,
	"max_continuous_discharge_a" double precision,
	"max_charge_a" double precision,
	"peak_discharge_a" double precision,
	"cycle_life" integer,
	"price_amount" numeric(14, 2),
	"price_currency" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "catalog_packs_org_sku_key" UNIQUE("organization_id","sku"),
	CONSTRAINT "catalog_packs_price_whole" CHECK (("catalog_packs"."price_amount" is null) = ("catalog_packs"."price_currency" is null))
);
--> statement-breakpoint
ALTER TABLE "catalog_hosts" ADD CONSTRAINT "catalog_hosts_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "catalog_packs" ADD CONSTRAINT "catalog_packs_organization_id_organizations_id_fk" FOREIGN KEY ("organization_id") REFERENCES "public"."organizations"("id") ON DELETE cascade ON UPDATE no action;
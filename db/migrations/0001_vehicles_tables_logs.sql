CREATE TYPE "public"."revision_status" AS ENUM('draft', 'in_review', 'approved', 'sent_back');--> statement-breakpoint
CREATE TYPE "public"."log_kind" AS ENUM('road', 'dyno');--> statement-breakpoint
CREATE TYPE "public"."log_status" AS ENUM('queued', 'parsing', 'ready', 'failed');--> statement-breakpoint
CREATE TABLE "vehicles" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"label" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"displacement_l" double precision NOT NULL,
	"cylinders" integer NOT NULL,
	"fuel" text NOT NULL,
	"stoich_afr" double precision NOT NULL,
	"injector_cc_min" double precision NOT NULL,
	"tire_diameter_mm" double precision NOT NULL,
	"gear_ratios" double precision[] NOT NULL,
	"final_drive" double precision NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"table_id" uuid NOT NULL,
	"parent_id" uuid,
	"number" integer NOT NULL,
	"values" jsonb NOT NULL,
	"message" text DEFAULT '' NOT NULL,
	"status" "revision_status" DEFAULT 'draft' NOT NULL,
	"author_id" uuid NOT NULL,
	"analysis_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "ve_tables" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"vehicle_id" uuid NOT NULL,
	"name" text NOT NULL,
	"rpm_axis" double precision[] NOT NULL,
	"map_axis_kpa" double precision[] NOT NULL,
	"head_revision_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "log_channels" (
	"log_id" uuid NOT NULL,
	"channel" text NOT NULL,
	"encoding" text NOT NULL,
	"sample_count" integer NOT NULL,
	"data" "bytea" NOT NULL,
	CONSTRAINT "log_channels_log_id_channel_pk" PRIMARY KEY("log_id","channel")
);
--> statement-breakpoint
CREATE TABLE "logs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"vehicle_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text NOT NULL,
	"kind" "log_kind" NOT NULL,
	"ecu_revision_id" uuid,
	"mapping" jsonb NOT NULL,
	"status" "log_status" DEFAULT 'queued' NOT NULL,
	"progress" double precision DEFAULT 0 NOT NULL,
	"error" jsonb,
	"sample_count" integer,
	"duration_s" double precision,
	"channel_summary" jsonb,
	"parse_report" jsonb,
	"raw_path" text NOT NULL,
	"uploaded_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mapping_presets" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"name" text NOT NULL,
	"header_signature" text NOT NULL,
	"mapping" jsonb NOT NULL,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "analyses" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"shop_id" uuid NOT NULL,
	"table_id" uuid NOT NULL,
	"base_revision_id" uuid NOT NULL,
	"log_ids" uuid[] NOT NULL,
	"settings" jsonb NOT NULL,
	"cells" jsonb NOT NULL,
	"proposal" jsonb NOT NULL,
	"filter_report" jsonb NOT NULL,
	"lean_flags" jsonb NOT NULL,
	"created_by" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "vehicles" ADD CONSTRAINT "vehicles_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revisions" ADD CONSTRAINT "revisions_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revisions" ADD CONSTRAINT "revisions_table_id_ve_tables_id_fk" FOREIGN KEY ("table_id") REFERENCES "public"."ve_tables"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "revisions" ADD CONSTRAINT "revisions_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ve_tables" ADD CONSTRAINT "ve_tables_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ve_tables" ADD CONSTRAINT "ve_tables_vehicle_id_vehicles_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicles"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "log_channels" ADD CONSTRAINT "log_channels_log_id_logs_id_fk" FOREIGN KEY ("log_id") REFERENCES "public"."logs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "logs" ADD CONSTRAINT "logs_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "logs" ADD CONSTRAINT "logs_vehicle_id_vehicles_id_fk" FOREIGN KEY ("vehicle_id") REFERENCES "public"."vehicles"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "logs" ADD CONSTRAINT "logs_ecu_revision_id_revisions_id_fk" FOREIGN KEY ("ecu_revision_id") REFERENCES "public"."revisions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "logs" ADD CONSTRAINT "logs_uploaded_by_users_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mapping_presets" ADD CONSTRAINT "mapping_presets_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mapping_presets" ADD CONSTRAINT "mapping_presets_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_shop_id_shops_id_fk" FOREIGN KEY ("shop_id") REFERENCES "public"."shops"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_table_id_ve_tables_id_fk" FOREIGN KEY ("table_id") REFERENCES "public"."ve_tables"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_base_revision_id_revisions_id_fk" FOREIGN KEY ("base_revision_id") REFERENCES "public"."revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "vehicles_shop_idx" ON "vehicles" USING btree ("shop_id");--> statement-breakpoint
CREATE UNIQUE INDEX "revisions_table_number_key" ON "revisions" USING btree ("table_id","number");--> statement-breakpoint
CREATE INDEX "revisions_shop_idx" ON "revisions" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "ve_tables_shop_idx" ON "ve_tables" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "ve_tables_vehicle_idx" ON "ve_tables" USING btree ("vehicle_id");--> statement-breakpoint
CREATE UNIQUE INDEX "logs_vehicle_sha256_key" ON "logs" USING btree ("vehicle_id","sha256");--> statement-breakpoint
CREATE INDEX "logs_shop_idx" ON "logs" USING btree ("shop_id");--> statement-breakpoint
CREATE UNIQUE INDEX "mapping_presets_shop_signature_key" ON "mapping_presets" USING btree ("shop_id","header_signature");--> statement-breakpoint
CREATE INDEX "analyses_shop_idx" ON "analyses" USING btree ("shop_id");--> statement-breakpoint
CREATE INDEX "analyses_table_idx" ON "analyses" USING btree ("table_id");
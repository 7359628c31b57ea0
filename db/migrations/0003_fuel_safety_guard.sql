ALTER TABLE "vehicles" ADD COLUMN "load_line_percent_of_baro" double precision DEFAULT 90 NOT NULL;--> statement-breakpoint
ALTER TABLE "vehicles" ADD COLUMN "lean_allowance_percent" double precision DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "revisions" ADD COLUMN "applied" jsonb;
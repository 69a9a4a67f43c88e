CREATE TYPE "public"."calculation_kind" AS ENUM('weight-move', 'cable-run');--> statement-breakpoint
CREATE TABLE "boat_gm_calibrations" (
	"id" serial PRIMARY KEY NOT NULL,
	"boat_id" integer NOT NULL,
	"user_id" integer,
	"weight_kg" double precision NOT NULL,
	"shift_mm" double precision NOT NULL,
	"displacement_kg" double precision NOT NULL,
	"heel_deg" double precision,
	"deflection_mm" double precision,
	"plumb_length_mm" double precision,
	"gm_mm" double precision NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "boat_gm_calibrations_observation" CHECK ("boat_gm_calibrations"."heel_deg" is not null or ("boat_gm_calibrations"."deflection_mm" is not null and "boat_gm_calibrations"."plumb_length_mm" is not null))
);
--> statement-breakpoint
CREATE TABLE "boat_ledger_items" (
	"id" serial PRIMARY KEY NOT NULL,
	"boat_id" integer NOT NULL,
	"name" text NOT NULL,
	"weight_kg" double precision NOT NULL,
	"aft_of_bow_mm" double precision NOT NULL,
	"off_centre_mm" double precision DEFAULT 0 NOT NULL,
	"height_mm" double precision,
	"space_id" integer,
	"standard_item_slug" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "boat_ledger_items_positive" CHECK ("boat_ledger_items"."weight_kg" > 0 and "boat_ledger_items"."aft_of_bow_mm" >= 0)
);
--> statement-breakpoint
CREATE TABLE "class_particulars" (
	"id" integer PRIMARY KEY DEFAULT 1 NOT NULL,
	"light_displacement_kg" double precision NOT NULL,
	"gm_mm" double precision NOT NULL,
	"lwl_mm" double precision NOT NULL,
	"beam_mm" double precision NOT NULL,
	"loa_mm" double precision NOT NULL,
	"lcf_aft_of_bow_mm" double precision NOT NULL,
	"waterline_forward_end_mm" double precision DEFAULT 0 NOT NULL,
	"gm_longitudinal_mm" double precision,
	"mct1_ft_lb_per_in" double precision,
	"demo" boolean DEFAULT false NOT NULL,
	"updated_by" integer,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "class_particulars_one_row" CHECK ("class_particulars"."id" = 1),
	CONSTRAINT "class_particulars_positive" CHECK ("class_particulars"."light_displacement_kg" > 0 and "class_particulars"."gm_mm" > 0 and "class_particulars"."lwl_mm" > 0 and "class_particulars"."beam_mm" > 0 and "class_particulars"."loa_mm" > 0)
);
--> statement-breakpoint
CREATE TABLE "ledger_standard_items" (
	"id" serial PRIMARY KEY NOT NULL,
	"slug" text NOT NULL,
	"name" text NOT NULL,
	"weight_kg" double precision NOT NULL,
	"aft_of_bow_mm" double precision NOT NULL,
	"off_centre_mm" double precision DEFAULT 0 NOT NULL,
	"height_mm" double precision,
	"note" text DEFAULT '' NOT NULL,
	"sort_order" integer DEFAULT 0 NOT NULL,
	CONSTRAINT "ledger_standard_items_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
CREATE TABLE "writeup_calculations" (
	"id" serial PRIMARY KEY NOT NULL,
	"writeup_id" integer NOT NULL,
	"kind" "calculation_kind" NOT NULL,
	"position" integer DEFAULT 0 NOT NULL,
	"title" text DEFAULT '' NOT NULL,
	"input" jsonb NOT NULL,
	"created_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "boat_gm_calibrations" ADD CONSTRAINT "boat_gm_calibrations_boat_id_boats_id_fk" FOREIGN KEY ("boat_id") REFERENCES "public"."boats"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "boat_gm_calibrations" ADD CONSTRAINT "boat_gm_calibrations_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "boat_ledger_items" ADD CONSTRAINT "boat_ledger_items_boat_id_boats_id_fk" FOREIGN KEY ("boat_id") REFERENCES "public"."boats"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "boat_ledger_items" ADD CONSTRAINT "boat_ledger_items_space_id_spaces_id_fk" FOREIGN KEY ("space_id") REFERENCES "public"."spaces"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "class_particulars" ADD CONSTRAINT "class_particulars_updated_by_users_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_calculations" ADD CONSTRAINT "writeup_calculations_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_calculations" ADD CONSTRAINT "writeup_calculations_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "boat_gm_calibrations_boat_idx" ON "boat_gm_calibrations" USING btree ("boat_id","created_at");--> statement-breakpoint
CREATE INDEX "boat_ledger_items_boat_idx" ON "boat_ledger_items" USING btree ("boat_id","id");--> statement-breakpoint
CREATE INDEX "writeup_calculations_writeup_idx" ON "writeup_calculations" USING btree ("writeup_id","position");
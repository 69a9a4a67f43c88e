CREATE TYPE "public"."digest_status" AS ENUM('draft', 'issued');--> statement-breakpoint
CREATE TABLE "digest_editions" (
	"id" serial PRIMARY KEY NOT NULL,
	"year" integer NOT NULL,
	"edition" integer NOT NULL,
	"status" "digest_status" DEFAULT 'draft' NOT NULL,
	"editor_letter" text DEFAULT '' NOT NULL,
	"correction_note" text DEFAULT '' NOT NULL,
	"compiled_by" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	"issued_at" timestamp with time zone,
	"issued_by" integer,
	"content" jsonb,
	"pdf_key" text,
	"pdf_built_at" timestamp with time zone,
	"mailed_count" integer,
	CONSTRAINT "digest_editions_year_range" CHECK ("digest_editions"."year" between 1971 and 2200 and "digest_editions"."edition" >= 1),
	CONSTRAINT "digest_editions_issued_frozen" CHECK ("digest_editions"."status" = 'draft' or ("digest_editions"."content" is not null and "digest_editions"."issued_at" is not null))
);
--> statement-breakpoint
CREATE TABLE "digest_entries" (
	"edition_id" integer NOT NULL,
	"writeup_id" integer NOT NULL,
	"section_slug" text DEFAULT '' NOT NULL,
	"position" integer NOT NULL,
	"included" boolean DEFAULT true NOT NULL,
	CONSTRAINT "digest_entries_edition_id_writeup_id_pk" PRIMARY KEY("edition_id","writeup_id")
);
--> statement-breakpoint
ALTER TABLE "digest_editions" ADD CONSTRAINT "digest_editions_compiled_by_users_id_fk" FOREIGN KEY ("compiled_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "digest_editions" ADD CONSTRAINT "digest_editions_issued_by_users_id_fk" FOREIGN KEY ("issued_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "digest_entries" ADD CONSTRAINT "digest_entries_edition_id_digest_editions_id_fk" FOREIGN KEY ("edition_id") REFERENCES "public"."digest_editions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "digest_entries" ADD CONSTRAINT "digest_entries_writeup_id_writeups_id_fk" FOREIGN KEY ("writeup_id") REFERENCES "public"."writeups"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "digest_editions_year_edition_idx" ON "digest_editions" USING btree ("year","edition");--> statement-breakpoint
CREATE UNIQUE INDEX "digest_editions_one_draft_idx" ON "digest_editions" USING btree ("year") WHERE status = 'draft';--> statement-breakpoint
CREATE INDEX "digest_entries_order_idx" ON "digest_entries" USING btree ("edition_id","position");--> statement-breakpoint
-- An issued edition never changes: only its PDF and mailing bookkeeping may be filled in later,
-- and it cannot be deleted (a correction is a new edition).
CREATE FUNCTION digest_editions_keep_issued() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    RAISE EXCEPTION 'digest edition %/% is issued and cannot be deleted', OLD.year, OLD.edition;
  END IF;
  IF NEW.year IS DISTINCT FROM OLD.year OR NEW.edition IS DISTINCT FROM OLD.edition
     OR NEW.status IS DISTINCT FROM OLD.status OR NEW.content IS DISTINCT FROM OLD.content
     OR NEW.editor_letter IS DISTINCT FROM OLD.editor_letter
     OR NEW.correction_note IS DISTINCT FROM OLD.correction_note
     OR NEW.issued_at IS DISTINCT FROM OLD.issued_at THEN
    RAISE EXCEPTION 'digest edition %/% is issued and cannot be changed', OLD.year, OLD.edition;
  END IF;
  RETURN NEW;
END $$;--> statement-breakpoint
CREATE TRIGGER digest_editions_keep_issued BEFORE UPDATE OR DELETE ON digest_editions
  FOR EACH ROW WHEN (OLD.status = 'issued') EXECUTE FUNCTION digest_editions_keep_issued();

ALTER TABLE "writeup_calculations" ADD COLUMN "revision_id" integer;--> statement-breakpoint
-- Numbers attached before this migration showed to readers at once: they belong to the revision
-- readers see (the last published one, or before the first publication the latest one).
UPDATE "writeup_calculations" c SET "revision_id" = (
  SELECT r."id" FROM "writeup_revisions" r WHERE r."writeup_id" = c."writeup_id"
  ORDER BY (r."status" = 'published') DESC, r."number" DESC LIMIT 1
);--> statement-breakpoint
DELETE FROM "writeup_calculations" WHERE "revision_id" IS NULL;--> statement-breakpoint
ALTER TABLE "writeup_calculations" ALTER COLUMN "revision_id" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "writeup_calculations" ADD COLUMN "removed_in_revision_id" integer;--> statement-breakpoint
ALTER TABLE "writeup_calculations" ADD CONSTRAINT "writeup_calculations_revision_id_writeup_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."writeup_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "writeup_calculations" ADD CONSTRAINT "writeup_calculations_removed_in_revision_id_writeup_revisions_id_fk" FOREIGN KEY ("removed_in_revision_id") REFERENCES "public"."writeup_revisions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "writeup_calculations_revision_idx" ON "writeup_calculations" USING btree ("revision_id");--> statement-breakpoint
ALTER TABLE "writeup_calculations" ADD CONSTRAINT "writeup_calculations_removed_later" CHECK ("writeup_calculations"."removed_in_revision_id" is null or "writeup_calculations"."removed_in_revision_id" <> "writeup_calculations"."revision_id");
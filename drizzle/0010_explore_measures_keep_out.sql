ALTER TABLE "exploration_variants" DROP CONSTRAINT "exploration_variants_exploration_id_explorations_id_fk";
--> statement-breakpoint
ALTER TABLE "exploration_variants" ADD COLUMN "steer_ratio" real;--> statement-breakpoint
ALTER TABLE "exploration_variants" ADD COLUMN "clear" boolean;--> statement-breakpoint
ALTER TABLE "explorations" ADD COLUMN "chunks_done" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
CREATE FUNCTION "exploration_variants_cascade"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	DELETE FROM "exploration_variants" WHERE "exploration_id" = OLD."id";
	RETURN OLD;
END
$$;--> statement-breakpoint
CREATE TRIGGER "explorations_delete_variants" AFTER DELETE ON "explorations" FOR EACH ROW EXECUTE FUNCTION "exploration_variants_cascade"();

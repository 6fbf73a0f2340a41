CREATE TABLE "tolerance_chunks" (
	"run_id" uuid NOT NULL,
	"chunk" integer NOT NULL,
	"ok" "bytea" NOT NULL,
	"values" "bytea" NOT NULL,
	CONSTRAINT "tolerance_chunks_run_id_chunk_pk" PRIMARY KEY("run_id","chunk")
);
--> statement-breakpoint
CREATE TABLE "tolerance_runs" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"revision_id" uuid NOT NULL,
	"spec" jsonb NOT NULL,
	"samples" integer NOT NULL,
	"chunk_size" integer NOT NULL,
	"chunks" integer NOT NULL,
	"chunks_done" integer DEFAULT 0 NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"error" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "exploration_variants" DROP CONSTRAINT "exploration_variants_exploration_id_explorations_id_fk";
--> statement-breakpoint
ALTER TABLE "exploration_variants" ADD COLUMN "steer_ratio" real;--> statement-breakpoint
ALTER TABLE "exploration_variants" ADD COLUMN "clear" boolean;--> statement-breakpoint
ALTER TABLE "explorations" ADD COLUMN "chunks_done" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "tolerance_chunks" ADD CONSTRAINT "tolerance_chunks_run_id_tolerance_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."tolerance_runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_runs" ADD CONSTRAINT "tolerance_runs_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_runs" ADD CONSTRAINT "tolerance_runs_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE FUNCTION "exploration_variants_cascade"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
	DELETE FROM "exploration_variants" WHERE "exploration_id" = OLD."id";
	RETURN OLD;
END
$$;--> statement-breakpoint
CREATE TRIGGER "explorations_delete_variants" AFTER DELETE ON "explorations" FOR EACH ROW EXECUTE FUNCTION "exploration_variants_cascade"();

CREATE TABLE "exploration_chunks" (
	"exploration_id" uuid NOT NULL,
	"chunk" integer NOT NULL,
	"feasible" integer NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "exploration_chunks_exploration_id_chunk_pk" PRIMARY KEY("exploration_id","chunk")
);
--> statement-breakpoint
CREATE TABLE "exploration_variants" (
	"exploration_id" uuid NOT NULL,
	"idx" integer NOT NULL,
	"ok" boolean NOT NULL,
	"toe_rms" real,
	"camber_gain" real,
	"rc_height" real,
	"rc_migration" real,
	"motion_ratio" real,
	CONSTRAINT "exploration_variants_exploration_id_idx_pk" PRIMARY KEY("exploration_id","idx")
);
--> statement-breakpoint
CREATE TABLE "explorations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"corner_id" uuid NOT NULL,
	"revision_id" uuid NOT NULL,
	"spec" jsonb NOT NULL,
	"variants" integer NOT NULL,
	"chunk_size" integer NOT NULL,
	"chunks" integer NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"error" text,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"finished_at" timestamp with time zone
);
--> statement-breakpoint
ALTER TABLE "exploration_chunks" ADD CONSTRAINT "exploration_chunks_exploration_id_explorations_id_fk" FOREIGN KEY ("exploration_id") REFERENCES "public"."explorations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "exploration_variants" ADD CONSTRAINT "exploration_variants_exploration_id_explorations_id_fk" FOREIGN KEY ("exploration_id") REFERENCES "public"."explorations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "explorations" ADD CONSTRAINT "explorations_corner_id_corners_id_fk" FOREIGN KEY ("corner_id") REFERENCES "public"."corners"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "explorations" ADD CONSTRAINT "explorations_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "explorations" ADD CONSTRAINT "explorations_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "explorations_corner_idx" ON "explorations" USING btree ("corner_id","created_at");
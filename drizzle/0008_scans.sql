CREATE TABLE "point_sources" (
	"revision_id" uuid NOT NULL,
	"point" text NOT NULL,
	"scan_id" uuid,
	"scan_name" text NOT NULL,
	"fit" text NOT NULL,
	"residual_mm" double precision,
	"points_used" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "point_sources_revision_id_point_pk" PRIMARY KEY("revision_id","point")
);
--> statement-breakpoint
CREATE TABLE "scans" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"car_id" uuid NOT NULL,
	"corner_id" uuid,
	"name" text NOT NULL,
	"format" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"object_key" text NOT NULL,
	"upload_id" text,
	"preview_key" text,
	"status" text DEFAULT 'uploading' NOT NULL,
	"status_at" timestamp with time zone DEFAULT now() NOT NULL,
	"error" text,
	"stats" jsonb,
	"unit" text,
	"alignment" jsonb,
	"created_by" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "scans_format_check" CHECK ("scans"."format" in ('stl', 'ply', 'obj')),
	CONSTRAINT "scans_status_check" CHECK ("scans"."status" in ('uploading', 'processing', 'ready', 'failed')),
	CONSTRAINT "scans_size_check" CHECK ("scans"."size_bytes" > 0)
);
--> statement-breakpoint
ALTER TABLE "point_sources" ADD CONSTRAINT "point_sources_revision_id_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "point_sources" ADD CONSTRAINT "point_sources_scan_id_scans_id_fk" FOREIGN KEY ("scan_id") REFERENCES "public"."scans"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scans" ADD CONSTRAINT "scans_car_id_cars_id_fk" FOREIGN KEY ("car_id") REFERENCES "public"."cars"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scans" ADD CONSTRAINT "scans_corner_id_corners_id_fk" FOREIGN KEY ("corner_id") REFERENCES "public"."corners"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "scans" ADD CONSTRAINT "scans_created_by_users_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "scans_car_idx" ON "scans" USING btree ("car_id","created_at");--> statement-breakpoint
CREATE INDEX "scans_status_idx" ON "scans" USING btree ("status","status_at");
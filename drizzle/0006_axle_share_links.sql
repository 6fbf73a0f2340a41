ALTER TABLE "share_links" DROP CONSTRAINT "share_links_scope_check";--> statement-breakpoint
ALTER TABLE "share_links" DROP CONSTRAINT "share_links_scope_target";--> statement-breakpoint
ALTER TABLE "share_links" ADD COLUMN "car_revision_id" uuid;--> statement-breakpoint
ALTER TABLE "share_links" ADD COLUMN "axle" text;--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_car_revision_id_car_revisions_id_fk" FOREIGN KEY ("car_revision_id") REFERENCES "public"."car_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "share_links_car_revision_idx" ON "share_links" USING btree ("car_revision_id","created_at");--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_axle_check" CHECK ("share_links"."axle" is null or "share_links"."axle" in ('front', 'rear'));--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_scope_check" CHECK ("share_links"."scope" in ('revision', 'car', 'axle'));--> statement-breakpoint
ALTER TABLE "share_links" ADD CONSTRAINT "share_links_scope_target" CHECK (("share_links"."scope" = 'revision' and "share_links"."revision_id" is not null) or ("share_links"."scope" = 'car' and "share_links"."car_id" is not null) or ("share_links"."scope" = 'axle' and "share_links"."car_revision_id" is not null and "share_links"."axle" is not null));
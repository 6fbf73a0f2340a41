CREATE TABLE "car_revisions" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"car_id" uuid NOT NULL,
	"number" integer NOT NULL,
	"label" text DEFAULT '' NOT NULL,
	"note" text DEFAULT '' NOT NULL,
	"model" jsonb NOT NULL,
	"corner_revisions" jsonb NOT NULL,
	"parent_id" uuid,
	"author_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "car_revisions_number_positive" CHECK ("car_revisions"."number" > 0)
);
--> statement-breakpoint
ALTER TABLE "car_revisions" ADD CONSTRAINT "car_revisions_car_id_cars_id_fk" FOREIGN KEY ("car_id") REFERENCES "public"."cars"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "car_revisions" ADD CONSTRAINT "car_revisions_parent_id_car_revisions_id_fk" FOREIGN KEY ("parent_id") REFERENCES "public"."car_revisions"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "car_revisions" ADD CONSTRAINT "car_revisions_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "car_revisions_car_number_key" ON "car_revisions" USING btree ("car_id","number");--> statement-breakpoint
-- Car revisions are immutable like corner revisions, by the same trigger function (migration 0001): the only update
-- allowed is the author set to null by the foreign key when an account is deleted.
CREATE TRIGGER car_revisions_immutable BEFORE UPDATE ON car_revisions
	FOR EACH ROW EXECUTE FUNCTION linkwright_revisions_immutable();

ALTER TABLE "corners" DROP CONSTRAINT "corners_kind_check";--> statement-breakpoint
ALTER TABLE "revisions" DROP CONSTRAINT "revisions_kind_check";--> statement-breakpoint
ALTER TABLE "corners" ADD CONSTRAINT "corners_kind_check" CHECK ("corners"."kind" in ('double_wishbone', 'strut', 'multi_link', 'semi_trailing'));--> statement-breakpoint
ALTER TABLE "revisions" ADD CONSTRAINT "revisions_kind_check" CHECK ("revisions"."kind" in ('double_wishbone', 'strut', 'multi_link', 'semi_trailing'));
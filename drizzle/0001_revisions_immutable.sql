-- Revisions are immutable: the database itself refuses to change one. The only update allowed is the
-- one a foreign key makes when an author's account is deleted (author_id set to null).
CREATE OR REPLACE FUNCTION linkwright_revisions_immutable() RETURNS trigger AS $$
BEGIN
	IF NEW.author_id IS NULL AND OLD.author_id IS NOT NULL
		AND (to_jsonb(NEW) - 'author_id') = (to_jsonb(OLD) - 'author_id') THEN
		RETURN NEW;
	END IF;
	RAISE EXCEPTION 'revision % is immutable: save a new revision instead', OLD.id
		USING ERRCODE = 'restrict_violation';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER revisions_immutable BEFORE UPDATE ON revisions
	FOR EACH ROW EXECUTE FUNCTION linkwright_revisions_immutable();
--> statement-breakpoint
-- The original bytes of an upload are kept as they came.
CREATE OR REPLACE FUNCTION linkwright_uploads_keep_bytes() RETURNS trigger AS $$
BEGIN
	IF NEW.bytes IS DISTINCT FROM OLD.bytes OR NEW.sha256 IS DISTINCT FROM OLD.sha256
		OR NEW.filename IS DISTINCT FROM OLD.filename THEN
		RAISE EXCEPTION 'upload % keeps its original file', OLD.id USING ERRCODE = 'restrict_violation';
	END IF;
	RETURN NEW;
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER uploads_keep_bytes BEFORE UPDATE ON uploads
	FOR EACH ROW EXECUTE FUNCTION linkwright_uploads_keep_bytes();

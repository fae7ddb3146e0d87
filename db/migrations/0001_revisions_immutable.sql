-- Section revisions are immutable: every save is a new row. The database refuses any UPDATE,
-- whatever the code path (deleting a whole section still cascades to its revisions).
CREATE OR REPLACE FUNCTION edgefield_refuse_revision_update() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'section revisions are immutable (revision %)', OLD.id USING ERRCODE = 'restrict_violation';
END;
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER section_revisions_immutable BEFORE UPDATE ON section_revisions
  FOR EACH ROW EXECUTE FUNCTION edgefield_refuse_revision_update();

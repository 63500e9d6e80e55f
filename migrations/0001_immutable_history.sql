-- History is never rewritten: versions, their cells, cell revisions, comment texts, verdicts and the audit
-- log refuse UPDATE and DELETE at the database, whatever the application code does.
CREATE OR REPLACE FUNCTION laminote_refuse_change() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'rows of % are immutable (% refused)', TG_TABLE_NAME, TG_OP USING ERRCODE = 'restrict_violation';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER versions_immutable BEFORE UPDATE OR DELETE ON versions FOR EACH ROW EXECUTE FUNCTION laminote_refuse_change();
--> statement-breakpoint
CREATE TRIGGER version_cells_immutable BEFORE UPDATE OR DELETE ON version_cells FOR EACH ROW EXECUTE FUNCTION laminote_refuse_change();
--> statement-breakpoint
CREATE TRIGGER cell_revisions_immutable BEFORE UPDATE OR DELETE ON cell_revisions FOR EACH ROW EXECUTE FUNCTION laminote_refuse_change();
--> statement-breakpoint
CREATE TRIGGER comment_revisions_immutable BEFORE UPDATE OR DELETE ON comment_revisions FOR EACH ROW EXECUTE FUNCTION laminote_refuse_change();
--> statement-breakpoint
CREATE TRIGGER verdicts_immutable BEFORE UPDATE OR DELETE ON verdicts FOR EACH ROW EXECUTE FUNCTION laminote_refuse_change();
--> statement-breakpoint
CREATE TRIGGER audit_events_immutable BEFORE UPDATE OR DELETE ON audit_events FOR EACH ROW EXECUTE FUNCTION laminote_refuse_change();

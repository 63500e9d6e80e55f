-- A draft's cells and trash get a token that names their content: a new number from a sequence on every
-- insert and on every update that sets either column, whoever writes it (a save, a restore, an import,
-- a hand-made change), so a server may keep the parsed cells of a draft by (branch, token) and skip
-- reading ~100 kB of cells again while they are unchanged (issue 15). Rows that exist keep 0 until
-- their cells are next written: the token is unique per branch, not across branches.
ALTER TABLE "drafts" ADD COLUMN "cells_token" bigint DEFAULT 0 NOT NULL;--> statement-breakpoint
CREATE SEQUENCE "drafts_cells_token_seq";--> statement-breakpoint
CREATE FUNCTION "drafts_cells_token"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  NEW."cells_token" := nextval('drafts_cells_token_seq');
  RETURN NEW;
END
$$;--> statement-breakpoint
CREATE TRIGGER "drafts_cells_token" BEFORE INSERT OR UPDATE OF "cells", "trash" ON "drafts"
  FOR EACH ROW EXECUTE FUNCTION "drafts_cells_token"();

-- A draft's output keys (each cell's last run and last ok run) move out of its cells' JSON into a
-- column of their own, by cell id: a run records keys and edits nothing, and it rewrote the whole of
-- drafts.cells (a pasted table is tens of kB) only to do so; now it writes this small value (issue 15).
ALTER TABLE "drafts" ADD COLUMN "output_keys" jsonb DEFAULT '{}'::jsonb NOT NULL;--> statement-breakpoint
-- The keys of the cells and of the trash (a cell brought back from the trash keeps its keys; one in
-- both, which a save never leaves, keeps the keys it has in the cells).
UPDATE "drafts" d SET
  "output_keys" = coalesce((
    SELECT jsonb_object_agg(c ->> 'cellId', jsonb_build_object('last', coalesce(c -> 'lastOutputKey', 'null'::jsonb), 'good', coalesce(c -> 'lastGoodOutputKey', 'null'::jsonb)) ORDER BY e.n)
    FROM jsonb_array_elements(d."trash" || d."cells") WITH ORDINALITY AS e(c, n)
    WHERE coalesce(c ->> 'lastOutputKey', c ->> 'lastGoodOutputKey') IS NOT NULL
  ), '{}'::jsonb),
  "cells" = (
    SELECT coalesce(jsonb_agg(c - 'lastOutputKey' - 'lastGoodOutputKey' ORDER BY n), '[]'::jsonb)
    FROM jsonb_array_elements(d."cells") WITH ORDINALITY AS e(c, n)
  ),
  "trash" = (
    SELECT coalesce(jsonb_agg(c - 'lastOutputKey' - 'lastGoodOutputKey' ORDER BY n), '[]'::jsonb)
    FROM jsonb_array_elements(d."trash") WITH ORDINALITY AS e(c, n)
  );

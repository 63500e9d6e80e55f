-- A chunk of a sweep's cases stored in one call with its values as parameters (issue 13): the worker
-- sends the chunk's JSON as the bytes its engine wrote, not written into a query string as a literal.
-- The cases of one sweep are stored in turn (a lock on its key, held to the end of the transaction),
-- and the count after the lock is a statement of its own, which in READ COMMITTED sees every chunk
-- committed before it (a VOLATILE function takes a new snapshot for each statement): two chunks storing
-- their last cases at once cannot both miss the other's, so exactly one of them puts the sweep together.
-- 1305 keeps these locks apart from any other advisory lock (SWEEP_LOCK_SEED in server/src/jobs/runner.ts).
CREATE FUNCTION "store_sweep_cases"(p_key text, p_indices integer[], p_steps jsonb, p_channel text, p_notice text)
RETURNS integer LANGUAGE plpgsql VOLATILE AS $$
DECLARE
  stored integer;
BEGIN
  PERFORM pg_advisory_xact_lock(hashtextextended(p_key, 1305));
  INSERT INTO "sweep_cases" ("sweep_key", "index", "step")
    SELECT p_key, c.index, c.step
      FROM ROWS FROM (unnest(p_indices), jsonb_array_elements(p_steps)) AS c(index, step)
    ON CONFLICT DO NOTHING;
  PERFORM pg_notify(p_channel, p_notice);
  SELECT count(*) INTO stored FROM "sweep_cases" WHERE "sweep_key" = p_key;
  RETURN stored;
END
$$;

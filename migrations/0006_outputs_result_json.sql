-- A computed output's result is kept as json (its text, checked to be JSON) instead of jsonb: nothing
-- queries inside a result, and parsing tens of kB of numbers into jsonb on every run was about half of
-- PostgreSQL's CPU per run in `npm run bench -- server/bench/notebook` (issue 15). Changing the type
-- resets the column's compression, so LZ4 is set again where the server has it (as in 0005_toast_lz4).
ALTER TABLE "outputs" ALTER COLUMN "result" SET DATA TYPE json;--> statement-breakpoint
DO $$
BEGIN
  IF current_setting('server_version_num')::int >= 140000
     AND EXISTS (SELECT 1 FROM pg_settings WHERE name = 'default_toast_compression' AND 'lz4' = ANY (enumvals)) THEN
    ALTER TABLE "outputs" ALTER COLUMN "result" SET COMPRESSION lz4;
  END IF;
END
$$;

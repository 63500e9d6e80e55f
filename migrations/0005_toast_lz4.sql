-- Large values that every run writes (a draft's cells, with their pasted tables, and a computed output's
-- result, tens of kB each) are compressed with LZ4 rather than pglz: it compresses and reads back several
-- times faster for about the same size, which took about a third off PostgreSQL's CPU per run in
-- `npm run bench -- server/bench/notebook` (issue 15). Only values written from now on use it. A server
-- without LZ4 (built without it, or older than PostgreSQL 14) keeps pglz: the change is skipped there.
DO $$
BEGIN
  IF current_setting('server_version_num')::int >= 140000
     AND EXISTS (SELECT 1 FROM pg_settings WHERE name = 'default_toast_compression' AND 'lz4' = ANY (enumvals)) THEN
    ALTER TABLE "drafts" ALTER COLUMN "cells" SET COMPRESSION lz4;
    ALTER TABLE "outputs" ALTER COLUMN "result" SET COMPRESSION lz4;
  END IF;
END
$$;

-- Every API process keeps signed-in sessions and the library's unfiltered pages in memory
-- (src/cache/caches.ts, docs/decisions/0050-in-process-caches.md) and LISTENs on barmkeep_cache.
-- These triggers say what changed, whichever code writes it; PostgreSQL delivers the notification
-- when the transaction commits (identical ones once per transaction).
-- 'u:<user id>': the person's row or one of their sessions changed or went (their cached sessions go).
CREATE FUNCTION cache_notify_user() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_TABLE_NAME = 'users' THEN
    PERFORM pg_notify('barmkeep_cache', 'u:' || OLD.id);
  ELSE
    PERFORM pg_notify('barmkeep_cache', 'u:' || OLD.user_id);
  END IF;
  RETURN NULL;
END;
$$;--> statement-breakpoint
CREATE TRIGGER users_cache_notify AFTER UPDATE OR DELETE ON users
  FOR EACH ROW EXECUTE FUNCTION cache_notify_user();--> statement-breakpoint
CREATE TRIGGER sessions_cache_notify AFTER UPDATE OR DELETE ON sessions
  FOR EACH ROW EXECUTE FUNCTION cache_notify_user();--> statement-breakpoint
-- 'l:<user id>': a culture the person keeps came, went, or changed in a column the library list
-- shows (apps/api/src/db/queries/cultures.ts summaryColumns; a test checks the two lists agree).
-- The reminder bookkeeping columns are left out on purpose: a pass rewrites them in bulk.
CREATE FUNCTION cache_notify_library() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP <> 'INSERT' THEN
    PERFORM pg_notify('barmkeep_cache', 'l:' || OLD.owner_user_id);
  END IF;
  IF TG_OP <> 'DELETE' AND (TG_OP = 'INSERT' OR NEW.owner_user_id IS DISTINCT FROM OLD.owner_user_id) THEN
    PERFORM pg_notify('barmkeep_cache', 'l:' || NEW.owner_user_id);
  END IF;
  RETURN NULL;
END;
$$;--> statement-breakpoint
CREATE TRIGGER cultures_cache_notify AFTER INSERT OR DELETE OR UPDATE OF
  id, label_code, owner_user_id, strain_name, species, tags, form, origin, state, generation, parent_id,
  location_label, storage_temp_c, made_at, attention_due_at, measured_at, measured_viability, suspect
  ON cultures FOR EACH ROW EXECUTE FUNCTION cache_notify_library();

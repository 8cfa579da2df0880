-- The handling log is append-only: a correction is a new event that supersedes an old one.
CREATE FUNCTION culture_events_refuse_update() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION 'culture_events is append-only; record a superseding event instead'
    USING ERRCODE = 'restrict_violation';
END;
$$;--> statement-breakpoint
CREATE TRIGGER culture_events_append_only BEFORE UPDATE ON culture_events
  FOR EACH ROW EXECUTE FUNCTION culture_events_refuse_update();--> statement-breakpoint
-- An event is superseded at most once, so corrections form a chain rather than a fork.
CREATE UNIQUE INDEX culture_events_supersedes_once ON culture_events (supersedes_event_id)
  WHERE supersedes_event_id IS NOT NULL;--> statement-breakpoint
-- Lineage cycles are impossible: a new row's parent already exists, and a changed parent may not be
-- the culture itself or one of its descendants. Re-parenting takes one transaction-wide lock so two
-- concurrent moves cannot each pass the check and together close a loop.
CREATE FUNCTION cultures_refuse_cycle() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF NEW.parent_id IS NULL OR NEW.parent_id IS NOT DISTINCT FROM OLD.parent_id THEN
    RETURN NEW;
  END IF;
  PERFORM pg_advisory_xact_lock(hashtext('barmkeep.culture_lineage'));
  IF EXISTS (
    WITH RECURSIVE up AS (
      SELECT id, parent_id, 1 AS depth FROM cultures WHERE id = NEW.parent_id
      UNION ALL
      SELECT c.id, c.parent_id, up.depth + 1 FROM cultures c JOIN up ON c.id = up.parent_id
      WHERE up.depth < 100000
    )
    SELECT 1 FROM up WHERE id = NEW.id
  ) THEN
    RAISE EXCEPTION 'a culture cannot descend from itself' USING ERRCODE = 'check_violation',
      CONSTRAINT = 'cultures_no_cycle';
  END IF;
  RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER cultures_no_cycle BEFORE UPDATE OF parent_id ON cultures
  FOR EACH ROW EXECUTE FUNCTION cultures_refuse_cycle();--> statement-breakpoint
CREATE INDEX cultures_owner_made_idx ON cultures (owner_user_id, made_at);

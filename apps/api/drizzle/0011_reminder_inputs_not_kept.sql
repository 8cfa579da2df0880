-- A culture that is not kept (pitched, discarded, given away, quarantined …) has no viability
-- crossing to watch: the trigger says so itself instead of leaving the row stale for the pass, so
-- the pass only recomputes kept cultures. No projection math here: "not kept, no crossing".
CREATE OR REPLACE FUNCTION cultures_reminder_inputs() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    NEW.viability_stale := true;
    NEW.viability_check_at := NULL;
    NEW.storage_check_at := NEW.attention_due_at;
    NEW.generation_noticed := false;
    PERFORM pg_notify('reminder_inputs', NEW.owner_user_id);
  ELSE
    IF (NEW.form, NEW.storage_temp_c, NEW.made_at, NEW.measured_at, NEW.measured_viability, NEW.state, NEW.owner_user_id)
       IS DISTINCT FROM
       (OLD.form, OLD.storage_temp_c, OLD.made_at, OLD.measured_at, OLD.measured_viability, OLD.state, OLD.owner_user_id) THEN
      NEW.viability_stale := true;
      PERFORM pg_notify('reminder_inputs', NEW.owner_user_id);
    ELSIF (NEW.attention_due_at, NEW.generation, NEW.origin, NEW.origin_details)
       IS DISTINCT FROM (OLD.attention_due_at, OLD.generation, OLD.origin, OLD.origin_details) THEN
      PERFORM pg_notify('reminder_inputs', NEW.owner_user_id);
    END IF;
    IF NEW.attention_due_at IS DISTINCT FROM OLD.attention_due_at THEN
      NEW.storage_check_at := NEW.attention_due_at;
    END IF;
    IF NEW.generation IS DISTINCT FROM OLD.generation THEN
      NEW.generation_noticed := false;
    END IF;
  END IF;
  IF NEW.viability_stale AND NEW.state NOT IN ('active', 'stored') THEN
    NEW.viability_stale := false;
    NEW.viability_crossing_at := NULL;
    NEW.viability_check_at := NULL;
  END IF;
  RETURN NEW;
END;
$$;--> statement-breakpoint
UPDATE cultures SET viability_stale = false, viability_crossing_at = NULL, viability_check_at = NULL
  WHERE viability_stale AND state NOT IN ('active', 'stored');

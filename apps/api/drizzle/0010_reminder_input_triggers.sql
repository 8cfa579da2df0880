-- Reminder inputs. Whatever writes a culture (the library, backups, the club bank, seeds, psql), a
-- change to what the viability projection depends on marks the row stale, and the reminders pass
-- recomputes stale rows with core's viabilityCrossingAt before it reads viability_crossing_at.
-- A new storage due date is pending again (storage_check_at), a new generation clears
-- generation_noticed (the pass clears / sets them once the notice for the row as it stands is stored).
-- A change to anything a rule reads also sends NOTIFY reminder_inputs <owner id>; the worker turns
-- that into a debounced pass for the person (NOTIFY is delivered on commit, never for a rollback).
-- Rows already stored: every due date is pending until the first pass finds its notice.
UPDATE cultures SET storage_check_at = attention_due_at WHERE attention_due_at IS NOT NULL;--> statement-breakpoint
CREATE FUNCTION cultures_reminder_inputs() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' THEN
    NEW.viability_stale := true;
    NEW.viability_check_at := NULL;
    NEW.storage_check_at := NEW.attention_due_at;
    NEW.generation_noticed := false;
    PERFORM pg_notify('reminder_inputs', NEW.owner_user_id);
    RETURN NEW;
  END IF;
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
  RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER cultures_reminder_inputs BEFORE INSERT OR UPDATE ON cultures
  FOR EACH ROW EXECUTE FUNCTION cultures_reminder_inputs();--> statement-breakpoint
-- The crossing is stored at the owner's threshold: a new threshold makes all their cultures stale,
-- and a new generation limit clears their generation_noticed.
-- The row is first inserted with every default (ensurePreferences); marking stale then too costs one
-- recompute of the person's cultures and keeps this right whatever an insert carries.
CREATE FUNCTION notification_prefs_reminder_inputs() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'INSERT' OR NEW.viability_threshold_pct IS DISTINCT FROM OLD.viability_threshold_pct THEN
    UPDATE cultures SET viability_stale = true WHERE owner_user_id = NEW.user_id AND NOT viability_stale;
  END IF;
  IF TG_OP = 'INSERT' OR NEW.generation_limit IS DISTINCT FROM OLD.generation_limit THEN
    UPDATE cultures SET generation_noticed = false WHERE owner_user_id = NEW.user_id AND generation_noticed;
  END IF;
  IF TG_OP = 'UPDATE' AND (NEW.viability_threshold_pct, NEW.warn_days, NEW.generation_limit, NEW.step_lead_hours, NEW.muted_kinds)
     IS DISTINCT FROM
     (OLD.viability_threshold_pct, OLD.warn_days, OLD.generation_limit, OLD.step_lead_hours, OLD.muted_kinds) THEN
    PERFORM pg_notify('reminder_inputs', NEW.user_id);
  END IF;
  RETURN NULL;
END;
$$;--> statement-breakpoint
CREATE TRIGGER notification_prefs_reminder_inputs AFTER INSERT OR UPDATE ON notification_preferences
  FOR EACH ROW EXECUTE FUNCTION notification_prefs_reminder_inputs();

ALTER TABLE "users" ADD COLUMN "culture_count" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
-- The library's unfiltered total (every culture a person keeps) is read from this counter instead of
-- counting the person's cultures on every page: a count walks every index entry, so it grew with the
-- library. The label-code trigger already updates the owner's row on every insert and owner change;
-- it now counts too, and a delete counts down.
UPDATE users u SET culture_count = counts.n
FROM (SELECT owner_user_id, count(*)::integer AS n FROM cultures GROUP BY owner_user_id) counts
WHERE counts.owner_user_id = u.id;--> statement-breakpoint
CREATE OR REPLACE FUNCTION cultures_assign_label_code() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  n integer;
BEGIN
  IF TG_OP = 'UPDATE' AND NEW.owner_user_id IS NOT DISTINCT FROM OLD.owner_user_id THEN
    RETURN NEW;
  END IF;
  IF TG_OP = 'UPDATE' THEN
    UPDATE users SET culture_count = culture_count - 1 WHERE id = OLD.owner_user_id;
  END IF;
  UPDATE users SET culture_label_seq = culture_label_seq + 1, culture_count = culture_count + 1
    WHERE id = NEW.owner_user_id
    RETURNING culture_label_seq INTO n;
  NEW.label_code := culture_label_code(NEW.strain_name, n);
  RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE FUNCTION cultures_count_down() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  -- when the owner is being deleted (the cascade), their row is already gone and this matches nothing
  UPDATE users SET culture_count = culture_count - 1 WHERE id = OLD.owner_user_id;
  RETURN NULL;
END;
$$;--> statement-breakpoint
CREATE TRIGGER cultures_count_down AFTER DELETE ON cultures
  FOR EACH ROW EXECUTE FUNCTION cultures_count_down();

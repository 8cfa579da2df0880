ALTER TABLE "users" ADD COLUMN "culture_label_seq" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "cultures" ADD COLUMN "label_code" text DEFAULT '' NOT NULL;--> statement-breakpoint
-- A jar's code: the strain's first letter (X when it has none) and the owner's running number, at
-- least three digits: "C-017". Short enough to write on a lid, unique per owner.
CREATE FUNCTION culture_label_code(strain text, n integer) RETURNS text LANGUAGE sql IMMUTABLE AS $$
  SELECT coalesce(nullif(upper(substr(regexp_replace(strain, '[^A-Za-z]', '', 'g'), 1, 1)), ''), 'X')
    || '-' || CASE WHEN n < 1000 THEN lpad(n::text, 3, '0') ELSE n::text END
$$;--> statement-breakpoint
-- Cultures already stored are numbered per owner in the order they were made.
WITH numbered AS (
  SELECT id, strain_name, row_number() OVER (PARTITION BY owner_user_id ORDER BY created_at, id) AS n
  FROM cultures
)
UPDATE cultures c SET label_code = culture_label_code(numbered.strain_name, numbered.n::integer)
FROM numbered WHERE numbered.id = c.id;--> statement-breakpoint
UPDATE users u SET culture_label_seq = counts.n
FROM (SELECT owner_user_id, count(*)::integer AS n FROM cultures GROUP BY owner_user_id) counts
WHERE counts.owner_user_id = u.id;--> statement-breakpoint
-- Every insert (the library, backups, the club bank, seeds) gets the owner's next number, whatever
-- it carries (a copied row's code would clash); the
-- counter row's lock keeps two simultaneous inserts from taking the same one. A culture that
-- changes owner takes the new owner's next number.
CREATE FUNCTION cultures_assign_label_code() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE
  n integer;
BEGIN
  IF TG_OP = 'UPDATE' AND NEW.owner_user_id IS NOT DISTINCT FROM OLD.owner_user_id THEN
    RETURN NEW;
  END IF;
  UPDATE users SET culture_label_seq = culture_label_seq + 1 WHERE id = NEW.owner_user_id
    RETURNING culture_label_seq INTO n;
  NEW.label_code := culture_label_code(NEW.strain_name, n);
  RETURN NEW;
END;
$$;--> statement-breakpoint
CREATE TRIGGER cultures_assign_label_code BEFORE INSERT OR UPDATE OF owner_user_id ON cultures
  FOR EACH ROW EXECUTE FUNCTION cultures_assign_label_code();--> statement-breakpoint
CREATE UNIQUE INDEX "cultures_owner_label_code_uq" ON "cultures" USING btree ("owner_user_id","label_code");

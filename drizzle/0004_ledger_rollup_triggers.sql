-- Keeps container_stock and cost_totals equal to the sums of the live ledger entries.
-- Every insert, tombstone or change of a ledger entry takes its old effect away and adds its new one.
CREATE FUNCTION ledger_rollup_apply(entry ledger_entries, sign integer) RETURNS void
LANGUAGE plpgsql AS $$
DECLARE
  entry_material uuid;
  entry_currency text;
  entry_build uuid;
BEGIN
  IF entry.deleted_at IS NOT NULL THEN
    RETURN;
  END IF;
  INSERT INTO container_stock (container_id, workshop_id, remaining)
  VALUES (entry.container_id, entry.workshop_id, sign * entry.quantity)
  ON CONFLICT (container_id) DO UPDATE SET remaining = container_stock.remaining + EXCLUDED.remaining;
  IF entry.kind IN ('pour-use', 'waste') THEN
    SELECT material_id, currency INTO entry_material, entry_currency FROM containers WHERE id = entry.container_id;
    SELECT build_id INTO entry_build FROM pours WHERE id = entry.pour_id;
    INSERT INTO cost_totals (workshop_id, build_id, material_id, month, currency, cost_minor)
    VALUES (
      entry.workshop_id,
      COALESCE(entry_build, '00000000-0000-0000-0000-000000000000'),
      entry_material,
      date_trunc('month', entry.at AT TIME ZONE 'UTC')::date,
      entry_currency,
      sign * entry.cost_minor
    )
    ON CONFLICT (workshop_id, build_id, material_id, month, currency)
    DO UPDATE SET cost_minor = cost_totals.cost_minor + EXCLUDED.cost_minor;
  END IF;
END;
$$;
--> statement-breakpoint
CREATE FUNCTION ledger_rollup_trigger() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP IN ('UPDATE', 'DELETE') THEN
    PERFORM ledger_rollup_apply(OLD, -1);
  END IF;
  IF TG_OP IN ('INSERT', 'UPDATE') THEN
    PERFORM ledger_rollup_apply(NEW, 1);
  END IF;
  RETURN NULL;
END;
$$;
--> statement-breakpoint
CREATE TRIGGER ledger_entries_rollup
AFTER INSERT OR UPDATE OR DELETE ON ledger_entries
FOR EACH ROW EXECUTE FUNCTION ledger_rollup_trigger();
--> statement-breakpoint
-- Entries written before the trigger existed.
SELECT ledger_rollup_apply(l, 1) FROM ledger_entries l;

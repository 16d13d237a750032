/**
 * Makes the database refuse some writes, as a failing disk or a lock timeout would: a trigger raises on each
 * `on` of `table` whose new row matches `when` (a condition over NEW, built by the test from its own constants,
 * never from input). Returns the undo, which drops the trigger and its function. The app sees only a refused write.
 */
import type postgres from "postgres";

export async function refuseRows(db: postgres.Sql, { name, table, on, when }: { name: string; table: string; on: "INSERT" | "UPDATE"; when: string }): Promise<() => Promise<void>> {
  const fn = `pourline_test_refuse_${name}`;
  await db.unsafe(`
    CREATE OR REPLACE FUNCTION ${fn}() RETURNS trigger AS $$
    BEGIN
      IF ${when} THEN RAISE EXCEPTION 'test: ${table} ${on.toLowerCase()} refused'; END IF;
      RETURN NEW;
    END $$ LANGUAGE plpgsql;
    DROP TRIGGER IF EXISTS ${fn} ON ${table};
    CREATE TRIGGER ${fn} BEFORE ${on} ON ${table} FOR EACH ROW EXECUTE FUNCTION ${fn}();`);
  return async () => {
    await db.unsafe(`DROP TRIGGER IF EXISTS ${fn} ON ${table}; DROP FUNCTION IF EXISTS ${fn}();`);
  };
}

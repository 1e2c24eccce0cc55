-- 0019_foreign_keys.sql rebuilt run_inputs (a primary key column cannot be changed in place), and dropping a table
-- drops its triggers. Re-create them unchanged from 0005_runs_immutable.sql: the stored inputs of a run are written
-- once and never changed or deleted. Every other table with triggers was changed in place and kept its triggers
-- (tests/unit/db/foreign-keys.test.ts checks that every trigger any migration creates still exists).
CREATE TRIGGER run_inputs_no_update BEFORE UPDATE ON run_inputs
BEGIN
  SELECT RAISE(ABORT, 'the stored inputs of a run cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER run_inputs_no_delete BEFORE DELETE ON run_inputs
BEGIN
  SELECT RAISE(ABORT, 'the stored inputs of a run cannot be deleted');
END;

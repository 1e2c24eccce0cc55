-- A finished run (completed or failed) is a permanent record: nothing about it may change except whether it is the
-- run the filing uses. Only a completed run can be marked for the filing. Finished runs cannot be deleted.
-- The stored inputs of a run are written once and never changed or deleted.
CREATE TRIGGER runs_finished_no_update BEFORE UPDATE ON runs
WHEN OLD.status IN ('completed', 'failed') AND (
  NEW.id IS NOT OLD.id OR NEW.firm_id IS NOT OLD.firm_id OR NEW.period_id IS NOT OLD.period_id
  OR NEW.method_statement_id IS NOT OLD.method_statement_id OR NEW.positions_upload_id IS NOT OLD.positions_upload_id
  OR NEW.capital_profile_id IS NOT OLD.capital_profile_id OR NEW.status IS NOT OLD.status OR NEW.stage IS NOT OLD.stage
  OR NEW.progress IS NOT OLD.progress OR NEW.input_hashes IS NOT OLD.input_hashes
  OR NEW.engine_version IS NOT OLD.engine_version OR NEW.results IS NOT OLD.results OR NEW.error IS NOT OLD.error
  OR NEW.reproduces_run_id IS NOT OLD.reproduces_run_id OR NEW.started_by IS NOT OLD.started_by
  OR NEW.started_at IS NOT OLD.started_at OR NEW.finished_at IS NOT OLD.finished_at
  OR NEW.heartbeat_at IS NOT OLD.heartbeat_at
)
BEGIN
  SELECT RAISE(ABORT, 'a finished run cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER runs_filing_run_completed BEFORE UPDATE OF is_filing_run ON runs
WHEN NEW.is_filing_run = 1 AND NEW.status <> 'completed'
BEGIN
  SELECT RAISE(ABORT, 'only a completed run can be the one the filing uses');
END;
--> statement-breakpoint
CREATE TRIGGER runs_filing_run_insert BEFORE INSERT ON runs
WHEN NEW.is_filing_run = 1 AND NEW.status <> 'completed'
BEGIN
  SELECT RAISE(ABORT, 'only a completed run can be the one the filing uses');
END;
--> statement-breakpoint
CREATE TRIGGER runs_finished_no_delete BEFORE DELETE ON runs
WHEN OLD.status IN ('completed', 'failed')
BEGIN
  SELECT RAISE(ABORT, 'a finished run cannot be deleted');
END;
--> statement-breakpoint
CREATE TRIGGER run_inputs_no_update BEFORE UPDATE ON run_inputs
BEGIN
  SELECT RAISE(ABORT, 'the stored inputs of a run cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER run_inputs_no_delete BEFORE DELETE ON run_inputs
BEGIN
  SELECT RAISE(ABORT, 'the stored inputs of a run cannot be deleted');
END;

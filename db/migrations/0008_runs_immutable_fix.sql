-- 0005 named the start time column started_at; the runs table stores it as created_at. Recreate the trigger so that
-- every column of a finished run is checked by its real name (until now no UPDATE of runs could be prepared).
DROP TRIGGER IF EXISTS runs_finished_no_update;
--> statement-breakpoint
CREATE TRIGGER runs_finished_no_update BEFORE UPDATE ON runs
WHEN OLD.status IN ('completed', 'failed') AND (
  NEW.id IS NOT OLD.id OR NEW.firm_id IS NOT OLD.firm_id OR NEW.period_id IS NOT OLD.period_id
  OR NEW.method_statement_id IS NOT OLD.method_statement_id OR NEW.positions_upload_id IS NOT OLD.positions_upload_id
  OR NEW.capital_profile_id IS NOT OLD.capital_profile_id OR NEW.status IS NOT OLD.status OR NEW.stage IS NOT OLD.stage
  OR NEW.progress IS NOT OLD.progress OR NEW.input_hashes IS NOT OLD.input_hashes
  OR NEW.engine_version IS NOT OLD.engine_version OR NEW.results IS NOT OLD.results OR NEW.error IS NOT OLD.error
  OR NEW.reproduces_run_id IS NOT OLD.reproduces_run_id OR NEW.started_by IS NOT OLD.started_by
  OR NEW.created_at IS NOT OLD.created_at OR NEW.finished_at IS NOT OLD.finished_at
  OR NEW.heartbeat_at IS NOT OLD.heartbeat_at
)
BEGIN
  SELECT RAISE(ABORT, 'a finished run cannot be changed');
END;

-- Approved method statement versions are permanent. Once a version is approved (or later superseded) nothing that
-- was approved may change: content, rationale, limitations, evidence, reason, who approved it and when. Its status
-- may only move approved → superseded. Approved and superseded versions cannot be deleted.
CREATE TRIGGER method_statements_approved_no_update BEFORE UPDATE ON method_statements
WHEN OLD.status IN ('approved', 'superseded') AND (
  NEW.content IS NOT OLD.content OR NEW.rationale IS NOT OLD.rationale OR NEW.limitations IS NOT OLD.limitations
  OR NEW.evidence IS NOT OLD.evidence OR NEW.reason IS NOT OLD.reason OR NEW.version IS NOT OLD.version
  OR NEW.firm_id IS NOT OLD.firm_id OR NEW.previous_id IS NOT OLD.previous_id OR NEW.created_by IS NOT OLD.created_by
  OR NEW.approved_by IS NOT OLD.approved_by OR NEW.co_approved_by IS NOT OLD.co_approved_by
  OR NEW.approved_at IS NOT OLD.approved_at OR NEW.id IS NOT OLD.id
)
BEGIN
  SELECT RAISE(ABORT, 'an approved method statement version cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER method_statements_status_forward BEFORE UPDATE OF status ON method_statements
WHEN (OLD.status = 'approved' AND NEW.status NOT IN ('approved', 'superseded'))
  OR (OLD.status = 'superseded' AND NEW.status <> 'superseded')
BEGIN
  SELECT RAISE(ABORT, 'an approved method statement version can only be superseded');
END;
--> statement-breakpoint
CREATE TRIGGER method_statements_approved_no_delete BEFORE DELETE ON method_statements
WHEN OLD.status IN ('approved', 'superseded')
BEGIN
  SELECT RAISE(ABORT, 'an approved method statement version cannot be deleted');
END;

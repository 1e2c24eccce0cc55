-- A signed filing is locked. Once a version is signed (and later filed or superseded by a newer version) nothing it
-- says may change: not its content, cover note, reason, run, version, people or period. Its status may only move
-- signed → filed (with the filing date and the regulator's reference) or signed → superseded (when a later change
-- makes a new version); a filed or superseded version never changes again. A version becomes signed only from
-- review and only with a signature in force. Signed, filed and superseded versions cannot be deleted.
-- Signatures are never changed or deleted, except that a signature in force is marked superseded once (time and
-- reason). Review comments are a permanent record. New versions start as drafts.
CREATE TRIGGER filings_locked_no_update BEFORE UPDATE ON filings
WHEN OLD.status IN ('signed', 'filed', 'superseded') AND (
  NEW.id IS NOT OLD.id OR NEW.firm_id IS NOT OLD.firm_id OR NEW.period_id IS NOT OLD.period_id OR NEW.run_id IS NOT OLD.run_id
  OR NEW.version IS NOT OLD.version OR NEW.previous_id IS NOT OLD.previous_id OR NEW.content IS NOT OLD.content
  OR NEW.cover_note IS NOT OLD.cover_note OR NEW.reason IS NOT OLD.reason OR NEW.prepared_by IS NOT OLD.prepared_by
  OR NEW.submitted_by IS NOT OLD.submitted_by OR NEW.created_at IS NOT OLD.created_at
)
BEGIN
  SELECT RAISE(ABORT, 'a signed filing cannot be changed: a change makes a new version');
END;
--> statement-breakpoint
CREATE TRIGGER filings_locked_status BEFORE UPDATE ON filings
WHEN OLD.status IN ('signed', 'filed', 'superseded') AND NOT (
  (NEW.status IS OLD.status AND NEW.filed_at IS OLD.filed_at AND NEW.filing_reference IS OLD.filing_reference)
  OR (OLD.status = 'signed' AND NEW.status = 'filed' AND OLD.filed_at IS NULL AND OLD.filing_reference IS NULL
      AND length(trim(coalesce(NEW.filed_at, ''))) > 0 AND length(trim(coalesce(NEW.filing_reference, ''))) > 0)
  OR (OLD.status = 'signed' AND NEW.status = 'superseded' AND NEW.filed_at IS OLD.filed_at AND NEW.filing_reference IS OLD.filing_reference)
)
BEGIN
  SELECT RAISE(ABORT, 'a signed filing can only be filed (with its date and reference) or superseded by a new version');
END;
--> statement-breakpoint
CREATE TRIGGER filings_signed_needs_signature BEFORE UPDATE OF status ON filings
WHEN NEW.status = 'signed' AND OLD.status IS NOT 'signed' AND (
  OLD.status IS NOT 'in_review'
  OR NOT EXISTS (SELECT 1 FROM signatures WHERE filing_id = NEW.id AND firm_id = NEW.firm_id AND superseded_at IS NULL)
)
BEGIN
  SELECT RAISE(ABORT, 'a filing becomes signed only from review and only with a signature in force');
END;
--> statement-breakpoint
CREATE TRIGGER filings_insert_as_draft BEFORE INSERT ON filings
WHEN NEW.status IS NOT 'draft'
BEGIN
  SELECT RAISE(ABORT, 'a filing version starts as a draft');
END;
--> statement-breakpoint
CREATE TRIGGER filings_locked_no_delete BEFORE DELETE ON filings
WHEN OLD.status IN ('signed', 'filed', 'superseded') OR EXISTS (SELECT 1 FROM signatures WHERE filing_id = OLD.id)
BEGIN
  SELECT RAISE(ABORT, 'a signed filing cannot be deleted');
END;
--> statement-breakpoint
CREATE TRIGGER signatures_only_in_review BEFORE INSERT ON signatures
WHEN (SELECT status FROM filings WHERE id = NEW.filing_id AND firm_id = NEW.firm_id) IS NOT 'in_review'
  OR NEW.superseded_at IS NOT NULL OR NEW.superseded_reason IS NOT NULL
BEGIN
  SELECT RAISE(ABORT, 'only a filing in review can be signed');
END;
--> statement-breakpoint
CREATE TRIGGER signatures_no_update BEFORE UPDATE ON signatures
WHEN NOT (
  OLD.superseded_at IS NULL AND NEW.superseded_at IS NOT NULL AND length(trim(coalesce(NEW.superseded_reason, ''))) > 0
  AND NEW.id IS OLD.id AND NEW.firm_id IS OLD.firm_id AND NEW.filing_id IS OLD.filing_id AND NEW.signer_id IS OLD.signer_id
  AND NEW.signer_name IS OLD.signer_name AND NEW.licence_reference IS OLD.licence_reference
  AND NEW.content_hash IS OLD.content_hash AND NEW.signed_at IS OLD.signed_at AND NEW.attestation IS OLD.attestation
  AND NEW.created_at IS OLD.created_at
)
BEGIN
  SELECT RAISE(ABORT, 'a signature cannot be changed; it can only be marked superseded, once');
END;
--> statement-breakpoint
CREATE TRIGGER signatures_no_delete BEFORE DELETE ON signatures
BEGIN
  SELECT RAISE(ABORT, 'a signature cannot be deleted');
END;
--> statement-breakpoint
CREATE TRIGGER review_comments_no_update BEFORE UPDATE ON review_comments
BEGIN
  SELECT RAISE(ABORT, 'a review comment cannot be changed');
END;
--> statement-breakpoint
CREATE TRIGGER review_comments_no_delete BEFORE DELETE ON review_comments
BEGIN
  SELECT RAISE(ABORT, 'a review comment cannot be deleted');
END;

-- Status, state and kind columns take only the values the code knows (a typo or a stray value is refused with the
-- column and the allowed values named). Triggers rather than CHECK constraints: SQLite adds a CHECK only by rebuilding
-- the table, which would drop the immutability triggers these tables carry. pack_files refuses every update already.
CREATE TRIGGER reporting_periods_state_allowed_insert BEFORE INSERT ON reporting_periods
WHEN NEW.state NOT IN ('open', 'in_review', 'signed', 'filed')
BEGIN
  SELECT RAISE(ABORT, 'reporting_periods.state must be one of: open, in_review, signed, filed');
END;
--> statement-breakpoint
CREATE TRIGGER reporting_periods_state_allowed_update BEFORE UPDATE OF state ON reporting_periods
WHEN NEW.state NOT IN ('open', 'in_review', 'signed', 'filed')
BEGIN
  SELECT RAISE(ABORT, 'reporting_periods.state must be one of: open, in_review, signed, filed');
END;
--> statement-breakpoint
CREATE TRIGGER runs_status_allowed_insert BEFORE INSERT ON runs
WHEN NEW.status NOT IN ('queued', 'running', 'completed', 'failed')
BEGIN
  SELECT RAISE(ABORT, 'runs.status must be one of: queued, running, completed, failed');
END;
--> statement-breakpoint
CREATE TRIGGER runs_status_allowed_update BEFORE UPDATE OF status ON runs
WHEN NEW.status NOT IN ('queued', 'running', 'completed', 'failed')
BEGIN
  SELECT RAISE(ABORT, 'runs.status must be one of: queued, running, completed, failed');
END;
--> statement-breakpoint
CREATE TRIGGER filings_status_allowed_insert BEFORE INSERT ON filings
WHEN NEW.status NOT IN ('draft', 'in_review', 'changes_requested', 'signed', 'filed', 'superseded')
BEGIN
  SELECT RAISE(ABORT, 'filings.status must be one of: draft, in_review, changes_requested, signed, filed, superseded');
END;
--> statement-breakpoint
CREATE TRIGGER filings_status_allowed_update BEFORE UPDATE OF status ON filings
WHEN NEW.status NOT IN ('draft', 'in_review', 'changes_requested', 'signed', 'filed', 'superseded')
BEGIN
  SELECT RAISE(ABORT, 'filings.status must be one of: draft, in_review, changes_requested, signed, filed, superseded');
END;
--> statement-breakpoint
CREATE TRIGGER review_comments_kind_allowed_insert BEFORE INSERT ON review_comments
WHEN NEW.kind NOT IN ('comment', 'changes_requested', 'reply', 'submission_note')
BEGIN
  SELECT RAISE(ABORT, 'review_comments.kind must be one of: comment, changes_requested, reply, submission_note');
END;
--> statement-breakpoint
CREATE TRIGGER review_comments_kind_allowed_update BEFORE UPDATE OF kind ON review_comments
WHEN NEW.kind NOT IN ('comment', 'changes_requested', 'reply', 'submission_note')
BEGIN
  SELECT RAISE(ABORT, 'review_comments.kind must be one of: comment, changes_requested, reply, submission_note');
END;
--> statement-breakpoint
CREATE TRIGGER method_statements_status_allowed_insert BEFORE INSERT ON method_statements
WHEN NEW.status NOT IN ('draft', 'approved', 'superseded', 'discarded')
BEGIN
  SELECT RAISE(ABORT, 'method_statements.status must be one of: draft, approved, superseded, discarded');
END;
--> statement-breakpoint
CREATE TRIGGER method_statements_status_allowed_update BEFORE UPDATE OF status ON method_statements
WHEN NEW.status NOT IN ('draft', 'approved', 'superseded', 'discarded')
BEGIN
  SELECT RAISE(ABORT, 'method_statements.status must be one of: draft, approved, superseded, discarded');
END;
--> statement-breakpoint
CREATE TRIGGER capital_rule_profiles_regimes_allowed_insert BEFORE INSERT ON capital_rule_profiles
WHEN NEW.regimes NOT IN ('internal_models', 'standardised', 'both')
BEGIN
  SELECT RAISE(ABORT, 'capital_rule_profiles.regimes must be one of: internal_models, standardised, both');
END;
--> statement-breakpoint
CREATE TRIGGER capital_rule_profiles_regimes_allowed_update BEFORE UPDATE OF regimes ON capital_rule_profiles
WHEN NEW.regimes NOT IN ('internal_models', 'standardised', 'both')
BEGIN
  SELECT RAISE(ABORT, 'capital_rule_profiles.regimes must be one of: internal_models, standardised, both');
END;
--> statement-breakpoint
CREATE TRIGGER capital_rule_profiles_filed_regime_allowed_insert BEFORE INSERT ON capital_rule_profiles
WHEN NEW.filed_regime NOT IN ('internal_models', 'standardised')
BEGIN
  SELECT RAISE(ABORT, 'capital_rule_profiles.filed_regime must be one of: internal_models, standardised');
END;
--> statement-breakpoint
CREATE TRIGGER capital_rule_profiles_filed_regime_allowed_update BEFORE UPDATE OF filed_regime ON capital_rule_profiles
WHEN NEW.filed_regime NOT IN ('internal_models', 'standardised')
BEGIN
  SELECT RAISE(ABORT, 'capital_rule_profiles.filed_regime must be one of: internal_models, standardised');
END;
--> statement-breakpoint
CREATE TRIGGER reminder_log_status_allowed_insert BEFORE INSERT ON reminder_log
WHEN NEW.status NOT IN ('pending', 'sending', 'sent', 'retry', 'failed', 'skipped')
BEGIN
  SELECT RAISE(ABORT, 'reminder_log.status must be one of: pending, sending, sent, retry, failed, skipped');
END;
--> statement-breakpoint
CREATE TRIGGER reminder_log_status_allowed_update BEFORE UPDATE OF status ON reminder_log
WHEN NEW.status NOT IN ('pending', 'sending', 'sent', 'retry', 'failed', 'skipped')
BEGIN
  SELECT RAISE(ABORT, 'reminder_log.status must be one of: pending, sending, sent, retry, failed, skipped');
END;
--> statement-breakpoint
CREATE TRIGGER jobs_state_allowed_insert BEFORE INSERT ON jobs
WHEN NEW.state NOT IN ('queued', 'running', 'completed', 'failed', 'interrupted')
BEGIN
  SELECT RAISE(ABORT, 'jobs.state must be one of: queued, running, completed, failed, interrupted');
END;
--> statement-breakpoint
CREATE TRIGGER jobs_state_allowed_update BEFORE UPDATE OF state ON jobs
WHEN NEW.state NOT IN ('queued', 'running', 'completed', 'failed', 'interrupted')
BEGIN
  SELECT RAISE(ABORT, 'jobs.state must be one of: queued, running, completed, failed, interrupted');
END;
--> statement-breakpoint
CREATE TRIGGER pack_files_state_allowed_insert BEFORE INSERT ON pack_files
WHEN NEW.state NOT IN ('draft', 'signed', 'filed', 'superseded')
BEGIN
  SELECT RAISE(ABORT, 'pack_files.state must be one of: draft, signed, filed, superseded');
END;
--> statement-breakpoint
CREATE TRIGGER pack_files_format_allowed_insert BEFORE INSERT ON pack_files
WHEN NEW.format NOT IN ('docx', 'xlsx')
BEGIN
  SELECT RAISE(ABORT, 'pack_files.format must be one of: docx, xlsx');
END;
--> statement-breakpoint
CREATE TRIGGER uploads_kind_allowed_insert BEFORE INSERT ON uploads
WHEN NEW.kind NOT IN ('positions', 'prices')
BEGIN
  SELECT RAISE(ABORT, 'uploads.kind must be one of: positions, prices');
END;
--> statement-breakpoint
CREATE TRIGGER uploads_kind_allowed_update BEFORE UPDATE OF kind ON uploads
WHEN NEW.kind NOT IN ('positions', 'prices')
BEGIN
  SELECT RAISE(ABORT, 'uploads.kind must be one of: positions, prices');
END;

-- A stored filing pack is the file as rendered for one filing version, state, format and content: it never changes.
-- A later state or version is a new row. Only a draft's earlier rendering (its content since edited) may be removed.
CREATE TRIGGER pack_files_no_update BEFORE UPDATE ON pack_files
BEGIN
  SELECT RAISE(ABORT, 'a stored filing pack cannot be changed; render a new one');
END;
--> statement-breakpoint
CREATE TRIGGER pack_files_no_delete BEFORE DELETE ON pack_files
WHEN OLD.state <> 'draft'
BEGIN
  SELECT RAISE(ABORT, 'a stored pack of a signed, filed or superseded version cannot be deleted');
END;

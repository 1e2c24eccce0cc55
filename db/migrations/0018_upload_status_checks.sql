-- The states of an upload now that a worker reads and stores it (db/schema/data.ts tells their order), and the parts
-- of what was read: only known values, as in 0016_enum_checks.sql.
CREATE TRIGGER uploads_status_allowed_insert BEFORE INSERT ON uploads
WHEN NEW.status NOT IN ('reading', 'pending', 'duplicate', 'failed', 'confirming', 'confirmed', 'cancelled', 'superseded')
BEGIN
  SELECT RAISE(ABORT, 'uploads.status must be one of: reading, pending, duplicate, failed, confirming, confirmed, cancelled, superseded');
END;
--> statement-breakpoint
CREATE TRIGGER uploads_status_allowed_update BEFORE UPDATE OF status ON uploads
WHEN NEW.status NOT IN ('reading', 'pending', 'duplicate', 'failed', 'confirming', 'confirmed', 'cancelled', 'superseded')
BEGIN
  SELECT RAISE(ABORT, 'uploads.status must be one of: reading, pending, duplicate, failed, confirming, confirmed, cancelled, superseded');
END;
--> statement-breakpoint
CREATE TRIGGER upload_parts_part_allowed_insert BEFORE INSERT ON upload_parts
WHEN NEW.part NOT IN ('rows', 'problems')
BEGIN
  SELECT RAISE(ABORT, 'upload_parts.part must be one of: rows, problems');
END;
--> statement-breakpoint
CREATE TRIGGER upload_parts_part_allowed_update BEFORE UPDATE OF part ON upload_parts
WHEN NEW.part NOT IN ('rows', 'problems')
BEGIN
  SELECT RAISE(ABORT, 'upload_parts.part must be one of: rows, problems');
END;

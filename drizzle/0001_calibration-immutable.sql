-- Approved coefficient sets are immutable: a correction is a new version (four-eyes rule of calibration labs).
CREATE TRIGGER coefficient_sets_approved_no_update BEFORE UPDATE ON coefficient_sets WHEN OLD.status = 'approved'
BEGIN SELECT RAISE(ABORT, 'approved coefficient sets are immutable; draft a new version'); END;
--> statement-breakpoint
CREATE TRIGGER coefficient_sets_approved_no_delete BEFORE DELETE ON coefficient_sets WHEN OLD.status = 'approved'
BEGIN SELECT RAISE(ABORT, 'approved coefficient sets are immutable; draft a new version'); END;

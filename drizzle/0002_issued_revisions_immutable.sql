-- An issued spec-sheet revision is the grinder's contract: refuse any change to it or its removal.
CREATE TRIGGER `sheet_revisions_issued_no_update`
BEFORE UPDATE ON `sheet_revisions`
WHEN OLD.`state` = 'issued'
BEGIN
  SELECT RAISE(ABORT, 'issued revisions are immutable');
END;
--> statement-breakpoint
CREATE TRIGGER `sheet_revisions_issued_no_delete`
BEFORE DELETE ON `sheet_revisions`
WHEN OLD.`state` = 'issued'
BEGIN
  SELECT RAISE(ABORT, 'issued revisions are immutable');
END;

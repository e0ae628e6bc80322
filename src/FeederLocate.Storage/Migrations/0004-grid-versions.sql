-- Every grid loaded, kept as a numbered version per grid name with its text, content hash, who, when and why.
-- Versions are append-only: a new load of a name is a new version, never a replacement.
CREATE TABLE grid_versions (
    id             INTEGER PRIMARY KEY AUTOINCREMENT,
    grid_name      TEXT    NOT NULL CHECK (length(grid_name) > 0),
    version        INTEGER NOT NULL CHECK (version >= 1),
    content_sha256 TEXT    NOT NULL CHECK (length(content_sha256) = 64),
    grid_text      TEXT    NOT NULL,
    loaded_at      TEXT    NOT NULL,  -- ISO 8601 UTC
    loaded_by      TEXT    NOT NULL CHECK (length(loaded_by) > 0),
    loaded_by_role TEXT    CHECK (loaded_by_role IS NULL OR length(loaded_by_role) > 0),
    reason         TEXT,              -- why this version was loaded (required when it replaces an earlier one)
    source         TEXT,              -- the file it came from, when known
    UNIQUE (grid_name, version)
);

CREATE TRIGGER grid_versions_are_append_only_update BEFORE UPDATE ON grid_versions
BEGIN
    SELECT RAISE(ABORT, 'grid versions are append-only: rows are never updated');
END;

CREATE TRIGGER grid_versions_are_append_only_delete BEFORE DELETE ON grid_versions
BEGIN
    SELECT RAISE(ABORT, 'grid versions are append-only: rows are never deleted');
END;

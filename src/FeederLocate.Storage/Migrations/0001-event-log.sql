-- The incident log: one row per incident, and its events in order. Both are append-only.
CREATE TABLE incidents (
    id          INTEGER PRIMARY KEY AUTOINCREMENT,
    grid_name   TEXT    NOT NULL,
    reported_at TEXT    NOT NULL,  -- ISO 8601 UTC
    created_at  TEXT    NOT NULL   -- ISO 8601 UTC, when the incident was logged
);

CREATE TABLE events (
    id          INTEGER PRIMARY KEY AUTOINCREMENT,
    incident_id INTEGER NOT NULL REFERENCES incidents (id),
    sequence    INTEGER NOT NULL CHECK (sequence >= 1),
    time        TEXT    NOT NULL,  -- ISO 8601 UTC, when the event was logged
    actor       TEXT    NOT NULL CHECK (length(actor) > 0),
    kind        TEXT    NOT NULL CHECK (length(kind) > 0),
    payload     TEXT    NOT NULL CHECK (json_valid(payload)),
    UNIQUE (incident_id, sequence)
);

CREATE TRIGGER incidents_are_append_only_update BEFORE UPDATE ON incidents
BEGIN
    SELECT RAISE(ABORT, 'incidents are append-only: rows are never updated');
END;

CREATE TRIGGER incidents_are_append_only_delete BEFORE DELETE ON incidents
BEGIN
    SELECT RAISE(ABORT, 'incidents are append-only: rows are never deleted');
END;

CREATE TRIGGER events_are_append_only_update BEFORE UPDATE ON events
BEGIN
    SELECT RAISE(ABORT, 'events are append-only: rows are never updated');
END;

CREATE TRIGGER events_are_append_only_delete BEFORE DELETE ON events
BEGIN
    SELECT RAISE(ABORT, 'events are append-only: rows are never deleted');
END;

-- Who may sign in, in which role, to which grids. Accounts are disabled, never deleted: the event log names them.
CREATE TABLE accounts (
    name                 TEXT    PRIMARY KEY CHECK (length(name) BETWEEN 1 AND 32),
    display_name         TEXT    NOT NULL CHECK (length(display_name) BETWEEN 1 AND 100),
    role                 TEXT    NOT NULL CHECK (role IN ('viewer', 'operator', 'engineer')),
    password_hash        TEXT    NOT NULL CHECK (length(password_hash) > 0),
    must_change_password INTEGER NOT NULL CHECK (must_change_password IN (0, 1)),
    grids                TEXT    CHECK (grids IS NULL OR json_valid(grids)),  -- JSON array of grid names; NULL: every grid
    security_stamp       TEXT    NOT NULL,  -- new whenever password, role, grids or status change: open sessions end
    failed_sign_ins      INTEGER NOT NULL DEFAULT 0 CHECK (failed_sign_ins >= 0),
    locked_until         TEXT,              -- ISO 8601 UTC
    disabled_at          TEXT,              -- ISO 8601 UTC
    created_at           TEXT    NOT NULL,
    created_by           TEXT    NOT NULL
);

-- Bearer tokens for telecontrol and other systems. Only a SHA-256 of the secret is kept; a token acts as its account.
CREATE TABLE api_tokens (
    id            INTEGER PRIMARY KEY AUTOINCREMENT,
    account_name  TEXT    NOT NULL REFERENCES accounts (name),
    label         TEXT    NOT NULL CHECK (length(label) BETWEEN 1 AND 100),
    secret_sha256 TEXT    NOT NULL UNIQUE CHECK (length(secret_sha256) = 64),
    prefix        TEXT    NOT NULL,  -- the first characters of the secret, to recognise it
    created_at    TEXT    NOT NULL,
    created_by    TEXT    NOT NULL,
    last_used_at  TEXT,
    revoked_at    TEXT,
    revoked_by    TEXT
);

-- Who changed which account or token, and how (append-only, like the event log).
CREATE TABLE account_changes (
    id      INTEGER PRIMARY KEY AUTOINCREMENT,
    time    TEXT NOT NULL,
    actor   TEXT NOT NULL CHECK (length(actor) > 0),
    action  TEXT NOT NULL CHECK (length(action) > 0),
    subject TEXT NOT NULL,
    detail  TEXT
);

CREATE TRIGGER account_changes_are_append_only_update BEFORE UPDATE ON account_changes
BEGIN
    SELECT RAISE(ABORT, 'account changes are append-only: rows are never updated');
END;

CREATE TRIGGER account_changes_are_append_only_delete BEFORE DELETE ON account_changes
BEGIN
    SELECT RAISE(ABORT, 'account changes are append-only: rows are never deleted');
END;

CREATE TRIGGER accounts_are_never_deleted BEFORE DELETE ON accounts
BEGIN
    SELECT RAISE(ABORT, 'accounts are disabled, never deleted: the event log names them');
END;

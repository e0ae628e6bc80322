-- Who acted in which capacity (operator, engineer, crew, system); null for events logged before.
ALTER TABLE events ADD COLUMN actor_role TEXT CHECK (actor_role IS NULL OR length(actor_role) > 0);

-- Outcomes are read per grid, newest history last.
CREATE INDEX incidents_by_grid ON incidents (grid_name, reported_at);

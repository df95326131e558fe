package logbook

import (
	"database/sql"
	"example.org/vigil/observe"
	"fmt"
	"math"
)

// putComps replaces the target's comparison and check stars.
func putComps(q querier, targetID int64, comps, checks []observe.Comp) error {
	if _, err := q.Exec("DELETE FROM comps WHERE target_id = ?", targetID); err != nil {
		return err
	}
	for _, set := range []struct {
		role string
		cs   []observe.Comp
	}{{"comp", comps}, {"check", checks}} {
		for _, c := range set.cs {
			if _, err := q.Exec("INSERT INTO comps(target_id, role, label, v_mag, bv) VALUES (?, ?, ?, ?, ?)",
				targetID, set.role, c.ID, c.V, nullable(c.BV)); err != nil {
				return fmt.Errorf("comparison star %q: %w", c.ID, err)
			}
		}
	}
	return nil
}

// Comps returns the target's comparison and check stars, in the order they
// were given.
func (lb *Logbook) Comps(target string) (comps, checks []observe.Comp, err error) {
	t, err := lb.Target(target)
	if err != nil {
		return nil, nil, err
	}
	return t.Comps, t.Checks, nil
}

// AddComp adds a comparison star (or, with check, a check star) to the
// target. Its ID must be new among the target's stars.
func (lb *Logbook) AddComp(target string, c observe.Comp, check bool) error {
	t, err := lb.Target(target)
	if err != nil {
		return err
	}
	if check {
		return lb.SetComps(target, t.Comps, append(t.Checks, c))
	}
	return lb.SetComps(target, append(t.Comps, c), t.Checks)
}

// DeleteComp removes the comparison or check star with this ID (any case)
// from the target.
func (lb *Logbook) DeleteComp(target, id string) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		tid, err := targetID(tx, target)
		if err != nil {
			return err
		}
		res, err := tx.Exec("DELETE FROM comps WHERE target_id = ? AND label = ? COLLATE NOCASE", tid, id)
		if err != nil {
			return err
		}
		if n, _ := res.RowsAffected(); n == 0 {
			return fmt.Errorf("target %q: comparison star %q: %w", target, id, ErrNotFound)
		}
		return nil
	}))
}

// SetComps replaces the target's comparison and check stars.
func (lb *Logbook) SetComps(target string, comps, checks []observe.Comp) error {
	return lb.wrap(lb.tx(func(tx *sql.Tx) error {
		ts, ids, err := loadTargets(tx, "WHERE t.name = ?", target)
		if err != nil {
			return err
		}
		if len(ts) == 0 {
			return fmt.Errorf("target %q: %w in the logbook", target, ErrNotFound)
		}
		t := ts[0]
		t.Comps, t.Checks = comps, checks
		if err := checkTarget(&t, math.NaN()); err != nil {
			return err
		}
		return putComps(tx, ids[0], comps, checks)
	}))
}

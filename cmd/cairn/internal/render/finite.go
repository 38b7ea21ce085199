package render

import (
	"fmt"
	"math"
)

// finite returns an error when a rate, share or other number in d's tables
// or its JSON form is infinite or not a number. Every number cairn shows
// comes from inputs within the documented limits, so one that is not finite
// is a programming error: the command stops with an error instead of
// printing "+Inf%".
func (d *Doc) finite() error {
	for _, b := range d.Blocks {
		if err := gridOf(b).finite(); err != nil {
			return err
		}
	}
	if err := gridOf(d.CSV).finite(); err != nil {
		return err
	}
	return finiteData("", d.Data)
}

func (p *Page) finite() error {
	ts := []*Table{p.Status, factsTable(p.Budget)}
	for _, pt := range p.Parts {
		ts = append(ts, pt.Table, factsTable(pt.Facts))
	}
	for _, s := range p.Goals {
		ts = append(ts, s.Projection, factsTable(s.Facts), factsTable(s.Assumptions))
	}
	for _, t := range ts {
		if err := t.finite(); err != nil {
			return err
		}
	}
	return nil
}

func factsTable(f *Facts) *Table {
	if f == nil {
		return nil
	}
	return f.table()
}

func (t *Table) finite() error {
	if t == nil {
		return nil
	}
	for _, r := range t.rowsAndTotal() {
		for i, c := range r {
			if math.IsInf(c.x, 0) || math.IsNaN(c.x) {
				col := ""
				if i < len(t.Cols) {
					col = t.Cols[i].Key
				}
				return fmt.Errorf("internal error: the %s column of table %q holds %v, not a number that can be shown", col, t.Title, c.x)
			}
		}
	}
	return nil
}

// finiteData checks the float64s of a JSON form, in maps and lists at any
// depth.
func finiteData(key string, v any) error {
	switch v := v.(type) {
	case float64:
		if math.IsInf(v, 0) || math.IsNaN(v) {
			return fmt.Errorf("internal error: %q holds %v, not a number that can be shown", key, v)
		}
	case map[string]any:
		for k, x := range v {
			if err := finiteData(k, x); err != nil {
				return err
			}
		}
	case []map[string]any:
		for _, x := range v {
			if err := finiteData(key, x); err != nil {
				return err
			}
		}
	case []any:
		for _, x := range v {
			if err := finiteData(key, x); err != nil {
				return err
			}
		}
	}
	return nil
}

package study

import (
	"fmt"
	"path/filepath"
	"slices"
	"strings"
)

// Merge joins the shard directories of one sweep into the full table, in point order. It
// checks that every shard swept the same design on the same grid (naming the shard that
// differs), and that every point of the grid is present exactly once (naming the missing and
// duplicated points). The journals are the source: a shard killed before writing its
// results.csv merges as long as all its points were journaled.
func Merge(dirs []string) (*Table, *Manifest, error) {
	if len(dirs) == 0 {
		return nil, nil, fmt.Errorf("study: merge needs at least one sweep directory")
	}
	var first *Manifest
	owner := map[int]string{}
	rows := map[int][]string{}
	var dups []string
	for _, dir := range dirs {
		m, err := ReadManifest(dir)
		if err != nil {
			return nil, nil, err
		}
		if first == nil {
			first = m
		} else if diff := first.Differs(m); diff != "" {
			return nil, nil, fmt.Errorf("study: shard %s in %s is not the sweep of %s: %s", m.Shard, dir, dirs[0], diff)
		}
		r, _, err := readJournal(filepath.Join(dir, JournalFile), m)
		if err != nil {
			return nil, nil, err
		}
		for i, row := range r {
			if prev, dup := owner[i]; dup {
				dups = append(dups, fmt.Sprintf("%d (in %s and %s)", i, prev, dir))
				continue
			}
			owner[i], rows[i] = dir, row
		}
	}
	slices.Sort(dups)
	var missing []int
	for i := range first.Points {
		if _, ok := rows[i]; !ok {
			missing = append(missing, i)
		}
	}
	var problems []string
	if len(missing) > 0 {
		problems = append(problems, fmt.Sprintf("%d of %d points missing: %s", len(missing), first.Points, listInts(missing)))
	}
	if len(dups) > 0 {
		problems = append(problems, fmt.Sprintf("%d points present more than once: %s", len(dups), listStrings(dups)))
	}
	if len(problems) > 0 {
		return nil, nil, fmt.Errorf("study: merge: %s", strings.Join(problems, "; "))
	}
	t := &Table{Columns: first.Columns}
	for i := range first.Points {
		t.Rows = append(t.Rows, rows[i])
	}
	whole := *first
	whole.Shard = Shard{K: 1, N: 1}
	return t, &whole, nil
}

// listLimit is how many items an error lists before "and N more".
const listLimit = 20

func listInts(v []int) string {
	s := make([]string, len(v))
	for i, x := range v {
		s[i] = fmt.Sprint(x)
	}
	return listStrings(s)
}

func listStrings(s []string) string {
	if len(s) <= listLimit {
		return strings.Join(s, ", ")
	}
	return strings.Join(s[:listLimit], ", ") + fmt.Sprintf(", and %d more", len(s)-listLimit)
}

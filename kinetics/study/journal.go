package study

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"os"
)

// journal is the append-only record of finished points: one JSON object per line,
// {"point": i, "row": [...]}, each line written whole and synced before the next.
type journal struct {
	path string
	f    *os.File
	rows map[int][]string
}

type journalLine struct {
	Point int      `json:"point"`
	Row   []string `json:"row"`
}

// openJournal loads the journal at path (creating it if absent), drops a last line cut short
// by a kill, and opens it for appending.
func openJournal(path string, m *Manifest) (*journal, error) {
	rows, good, err := readJournal(path, m)
	if err != nil && !errors.Is(err, os.ErrNotExist) {
		return nil, err
	}
	f, err := os.OpenFile(path, os.O_RDWR|os.O_CREATE, 0o644)
	if err != nil {
		return nil, fmt.Errorf("study: %w", err)
	}
	// Cut a partial last line so the next record starts on a line of its own.
	if err := f.Truncate(good); err != nil {
		f.Close()
		return nil, fmt.Errorf("study: %s: %w", path, err)
	}
	if _, err := f.Seek(good, io.SeekStart); err != nil {
		f.Close()
		return nil, fmt.Errorf("study: %s: %w", path, err)
	}
	return &journal{path: path, f: f, rows: rows}, nil
}

// readJournal returns the points recorded in a journal and the length of its whole lines.
// A last line without its newline (a write cut by a kill) is ignored; a malformed whole line,
// a point outside the grid or the shard, a row of the wrong width or a point recorded twice is
// an error, since the file is then not a journal of this sweep.
func readJournal(path string, m *Manifest) (map[int][]string, int64, error) {
	rows := map[int][]string{}
	b, err := os.ReadFile(path)
	if err != nil {
		return rows, 0, fmt.Errorf("study: %w", err)
	}
	var good int64
	line := 0
	for len(b) > 0 {
		nl := bytes.IndexByte(b, '\n')
		if nl < 0 {
			break // cut short
		}
		line++
		var jl journalLine
		if err := json.Unmarshal(b[:nl], &jl); err != nil {
			return nil, 0, fmt.Errorf("study: %s:%d: %w", path, line, err)
		}
		switch {
		case jl.Point < 0 || jl.Point >= m.Points:
			return nil, 0, fmt.Errorf("study: %s:%d: point %d outside the grid of %d points", path, line, jl.Point, m.Points)
		case !m.Shard.Owns(jl.Point):
			return nil, 0, fmt.Errorf("study: %s:%d: point %d is not in shard %s", path, line, jl.Point, m.Shard)
		case len(jl.Row) != len(m.Columns):
			return nil, 0, fmt.Errorf("study: %s:%d: %d fields, the table has %d columns", path, line, len(jl.Row), len(m.Columns))
		}
		if _, dup := rows[jl.Point]; dup {
			return nil, 0, fmt.Errorf("study: %s:%d: point %d recorded twice", path, line, jl.Point)
		}
		rows[jl.Point] = jl.Row
		good += int64(nl + 1)
		b = b[nl+1:]
	}
	return rows, good, nil
}

// append records one finished point and syncs it to disk.
func (j *journal) append(i int, row []string) error {
	b, err := json.Marshal(journalLine{Point: i, Row: row})
	if err != nil {
		return fmt.Errorf("study: %w", err)
	}
	if _, err := j.f.Write(append(b, '\n')); err != nil {
		return fmt.Errorf("study: journal %s: %w", j.path, err)
	}
	if err := j.f.Sync(); err != nil {
		return fmt.Errorf("study: journal %s: %w", j.path, err)
	}
	j.rows[i] = row
	return nil
}

func (j *journal) close() error { return j.f.Close() }

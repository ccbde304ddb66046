package study

import (
	"bytes"
	"encoding/json"
	"errors"
	"fmt"
	"hash/crc32"
	"io"
	"os"
)

// journal is the append-only record of finished points: one JSON object per line,
// {"point": i, "row": [...], "crc": "…"}, each line written whole and synced before the next.
// crc is the CRC-32 (IEEE) of the line's JSON without it, in hex, so that a line changed after
// it was written (a number edited by hand, a disk error) is refused rather than merged.
type journal struct {
	path string
	f    *os.File
	rows map[int][]string
}

// journalEntry is what a line records; journalLine adds the checksum.
type journalEntry struct {
	Point int      `json:"point"`
	Row   []string `json:"row"`
}

type journalLine struct {
	journalEntry
	CRC string `json:"crc"`
}

// checksum returns the CRC-32 of the JSON of e, in eight hex digits.
func (e journalEntry) checksum() (string, error) {
	b, err := json.Marshal(e)
	if err != nil {
		return "", err
	}
	return fmt.Sprintf("%08x", crc32.ChecksumIEEE(b)), nil
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

// maxLineBytes bounds the journal read into memory: at most this many bytes per grid point
// (a row is a few hundred bytes; a long failure message a few kilobytes).
const maxLineBytes = 16 << 10

// readJournal returns the points recorded in a journal and the length of its whole lines.
func readJournal(path string, m *Manifest) (map[int][]string, int64, error) {
	st, err := os.Stat(path)
	if err != nil {
		return map[int][]string{}, 0, fmt.Errorf("study: %w", err)
	}
	if limit := int64(m.Points) * maxLineBytes; st.Size() > limit {
		return nil, 0, fmt.Errorf("study: %s: %d bytes, more than a journal of %d points can hold (%d): not a journal of this sweep", path, st.Size(), m.Points, limit)
	}
	b, err := os.ReadFile(path)
	if err != nil {
		return map[int][]string{}, 0, fmt.Errorf("study: %w", err)
	}
	return parseJournal(b, path, m)
}

// parseJournal reads the lines of a journal (named path in messages). A last line without its
// newline (a write cut by a kill) is ignored; a malformed whole line, a line whose checksum
// does not match, a point outside the grid or the shard, a row of the wrong width or a point
// recorded twice is an error, since the file is then not a journal of this sweep.
func parseJournal(b []byte, path string, m *Manifest) (map[int][]string, int64, error) {
	rows := map[int][]string{}
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
			return nil, 0, fmt.Errorf("study: %s:%d: not a journal line: %w", path, line, err)
		}
		if jl.CRC == "" {
			return nil, 0, fmt.Errorf("study: %s:%d: no checksum: the journal was written by an older n2pulse; run the sweep afresh in a new directory", path, line)
		}
		if sum, err := jl.checksum(); err != nil || sum != jl.CRC {
			return nil, 0, fmt.Errorf("study: %s:%d: checksum %s does not match the line (%s): it was changed after it was written; remove the line to recompute the point", path, line, jl.CRC, sum)
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
	e := journalEntry{Point: i, Row: row}
	sum, err := e.checksum()
	if err != nil {
		return fmt.Errorf("study: %w", err)
	}
	b, err := json.Marshal(journalLine{e, sum})
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

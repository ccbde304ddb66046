package study

import (
	"encoding/json"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"

	"n2pulse/internal/atomicfile"
)

// manifestVersion is the format of sweep.json.
const manifestVersion = 1

// Manifest is the record of a sweep kept in its directory (sweep.json): enough to recognise
// the same sweep on resume and in a merge.
type Manifest struct {
	Version    int      `json:"version"`
	DesignName string   `json:"design_name"`
	DesignHash string   `json:"design_hash"` // DesignHash of the base design
	Design     string   `json:"design"`      // design.Design.String of the base design
	Axes       []Axis   `json:"axes"`
	Points     int      `json:"points"` // of the whole grid
	Columns    []string `json:"columns"`
	Shard      Shard    `json:"shard"`
	// Samples and Seed are the uncertainty samples per point (Sweep.Samples), absent without.
	Samples int    `json:"uncertainty_samples,omitempty"`
	Seed    uint64 `json:"uncertainty_seed,omitempty"`
	// Held are the constants the base design pins (HeldConstants), held in every sample;
	// absent without samples or pins. A --set at a default value pins a constant without
	// changing the design's listing, so resume and merge compare this too.
	Held []string `json:"uncertainty_held,omitempty"`
}

func (s *Sweep) manifest() *Manifest {
	m := &Manifest{
		Version:    manifestVersion,
		DesignName: s.Design.Name,
		DesignHash: DesignHash(s.Design),
		Design:     s.Design.String(),
		Axes:       s.Axes,
		Points:     s.Points(),
		Columns:    s.Columns(),
		Shard:      s.Shard.norm(),
		Samples:    s.Samples,
	}
	if s.Samples > 0 {
		m.Seed = s.Seed
		m.Held = HeldConstants(s.Design)
	}
	return m
}

// ReadManifest reads sweep.json from a sweep directory; the error wraps os.ErrNotExist when
// there is none.
func ReadManifest(dir string) (*Manifest, error) {
	path := filepath.Join(dir, ManifestFile)
	b, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("study: %w", err)
	}
	var m Manifest
	if err := json.Unmarshal(b, &m); err != nil {
		return nil, fmt.Errorf("study: %s: %w", path, err)
	}
	if m.Version != manifestVersion {
		return nil, fmt.Errorf("study: %s: format version %d, this program reads %d", path, m.Version, manifestVersion)
	}
	m.Shard = m.Shard.norm()
	return &m, nil
}

// Write saves the manifest as JSON at path, atomically.
func (m *Manifest) Write(path string) error {
	b, err := json.MarshalIndent(m, "", "  ")
	if err != nil {
		return fmt.Errorf("study: %w", err)
	}
	if err := atomicfile.WriteFile(path, append(b, '\n')); err != nil {
		return fmt.Errorf("study: %w", err)
	}
	return nil
}

// Differs describes how two manifests sweep different things (design, grid or columns), or
// returns "" when they are the same sweep; the shard is not compared.
func (m *Manifest) Differs(o *Manifest) string {
	if m.DesignHash != o.DesignHash {
		if k := firstDifference(m.Design, o.Design); k != "" {
			return "design differs at " + k
		}
		return "design differs"
	}
	if len(m.Axes) != len(o.Axes) {
		return fmt.Sprintf("%d varied keys against %d", len(m.Axes), len(o.Axes))
	}
	for i := range m.Axes {
		a, b := m.Axes[i], o.Axes[i]
		a.Display, b.Display = "", "" // the unit typed changes the figures, not the grid
		if a != b {
			x, y := m.Axes[i].String(), o.Axes[i].String()
			if x == y { // they differ beyond six figures
				x = fmt.Sprintf("%s=%v:%v:%d (log %v)", a.Key, a.From, a.To, a.N, a.Log)
				y = fmt.Sprintf("%s=%v:%v:%d (log %v)", b.Key, b.From, b.To, b.N, b.Log)
			}
			return fmt.Sprintf("axis %d: %s against %s", i+1, x, y)
		}
	}
	if m.Samples != o.Samples || m.Seed != o.Seed {
		return fmt.Sprintf("uncertainty samples %d (seed %d) against %d (seed %d)", m.Samples, m.Seed, o.Samples, o.Seed)
	}
	if !slices.Equal(m.Held, o.Held) {
		return fmt.Sprintf("constants held in the uncertainty samples [%s] against [%s]", strings.Join(m.Held, ", "), strings.Join(o.Held, ", "))
	}
	if !slices.Equal(m.Columns, o.Columns) {
		return "table columns differ (written by another version of the program)"
	}
	return ""
}

// firstDifference names the first line where two design listings differ.
func firstDifference(a, b string) string {
	la, lb := strings.Split(a, "\n"), strings.Split(b, "\n")
	for i := range max(len(la), len(lb)) {
		var x, y string
		if i < len(la) {
			x = la[i]
		}
		if i < len(lb) {
			y = lb[i]
		}
		if x != y {
			return fmt.Sprintf("%q against %q", x, y)
		}
	}
	return ""
}

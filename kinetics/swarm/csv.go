package swarm

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"

	"n2pulse/units"
)

// Columns are the leading CSV columns of a swarm table, in this order. The CSV is the one place
// with Td and eV; more columns may follow and are ignored by ReadCSV.
var Columns = []string{"reduced_field_Td", "mean_energy_eV", "drift_velocity_m_s", "alpha_N_m2",
	"eta_N_m2", "k_ion_m3_s", "k_att_m3_s", "k_A_m3_s", "k_B_m3_s", "k_C_m3_s"}

// ncols is the number of required columns.
const ncols = 10

// ThreeBodyColumn is the optional column of the three-body part of k_att at ReferenceDensity
// [m³/s]. A table without it has no three-body attachment to rescale (Table.AtDensity leaves
// it as it is).
const ThreeBodyColumn = "k_att3_m3_s"

// Limits of ReadCSV: a swarm table is a few hundred rows; these bounds keep a wrong file (a
// device, a huge log) from exhausting memory.
const (
	MaxCSVBytes = 16 << 20 // 16 MiB
	MaxCSVRows  = 100000
)

// OptionalColumns may follow the Columns anywhere in the header, found by name: ThreeBodyColumn, the rate
// coefficients of X → W³Δu and X → B′³Σu⁻ per N₂ molecule, and the power per electron and
// per molecule of the whole gas taken by each Channel of the power split, in eV m³/s. A
// table without them reads as zeros (no power split, no W and B′ feed).
var OptionalColumns = func() []string {
	c := []string{ThreeBodyColumn, "k_W_m3_s", "k_Bp_m3_s"}
	for ch := range NumChannels {
		c = append(c, "power_"+ch.String()+"_eV_m3_s")
	}
	return c
}()

// optionalValues returns the optional values of c in the order of OptionalColumns, in the
// CSV's units.
func optionalValues(c *Coefficients) []float64 {
	v := []float64{c.ThreeBodyAttachment, c.ExciteW, c.ExciteBPrime}
	for _, p := range c.Power {
		v = append(v, p/units.ElectronVolt)
	}
	return v
}

// setOptional sets the optional value number i (in the order of OptionalColumns, CSV units).
func setOptional(c *Coefficients, i int, x float64) {
	switch i {
	case 0:
		c.ThreeBodyAttachment = x
	case 1:
		c.ExciteW = x
	case 2:
		c.ExciteBPrime = x
	default:
		c.Power[i-3] = x * units.ElectronVolt
	}
}

// ReadCSV reads a swarm table: an optional block of '#' comment lines, a header with at least
// the Columns in order (OptionalColumns anywhere after them), then one row per reduced field.
// At most MaxCSVBytes and MaxCSVRows are read. Errors read "name:line: column: problem".
func ReadCSV(r io.Reader, name string) (*Table, error) {
	b, err := io.ReadAll(io.LimitReader(r, MaxCSVBytes+1))
	if err != nil {
		return nil, fmt.Errorf("swarm: %s: %w", name, err)
	}
	return parseCSV(b, name)
}

// parseCSV is ReadCSV of text already in memory (a shipped, solved or cached table): no copy
// through a reader.
func parseCSV(b []byte, name string) (*Table, error) {
	if len(b) > MaxCSVBytes {
		return nil, fmt.Errorf("swarm: %s: file larger than %d MiB, the limit of a swarm table", name, MaxCSVBytes>>20)
	}
	cr := csv.NewReader(bytes.NewReader(b))
	cr.FieldsPerRecord = -1
	cr.TrimLeadingSpace = true
	cr.Comment = '#'
	head, err := cr.Read()
	if err == io.EOF {
		return nil, fmt.Errorf("swarm: %s:1: header: missing", name)
	}
	if err != nil {
		return nil, fmt.Errorf("swarm: %s: %w", name, err)
	}
	hline, _ := cr.FieldPos(0)
	if len(head) < len(Columns) {
		return nil, fmt.Errorf("swarm: %s:%d: header: %d columns, need at least %d (%s)", name, hline, len(head), len(Columns), strings.Join(Columns, ", "))
	}
	for i, c := range Columns {
		if strings.TrimSpace(head[i]) != c {
			return nil, fmt.Errorf("swarm: %s:%d: header: column %d is %q, want %q", name, hline, i+1, head[i], c)
		}
	}
	optAt := make([]int, len(OptionalColumns)) // header index of each optional column, or −1
	for i, name := range OptionalColumns {
		optAt[i] = -1
		for j := len(Columns); j < len(head); j++ {
			if strings.TrimSpace(head[j]) == name {
				optAt[i] = j
				break
			}
		}
	}
	var rows []Coefficients
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				return nil, fmt.Errorf("swarm: %s:%d: %v", name, pe.Line, pe.Err)
			}
			return nil, fmt.Errorf("swarm: %s: %w", name, err)
		}
		ln, _ := cr.FieldPos(0)
		if len(rows) >= MaxCSVRows {
			return nil, fmt.Errorf("swarm: %s:%d: more than %d rows, the limit of a swarm table", name, ln, MaxCSVRows)
		}
		if len(rec) < len(Columns) {
			return nil, fmt.Errorf("swarm: %s:%d: %s: missing (row has %d columns, need %d)", name, ln, Columns[len(rec)], len(rec), len(Columns))
		}
		var v [ncols]float64
		for i := range Columns {
			x, err := strconv.ParseFloat(strings.TrimSpace(rec[i]), 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, fmt.Errorf("swarm: %s:%d: %s: %q is not a finite number", name, ln, Columns[i], rec[i])
			}
			if x < 0 {
				return nil, fmt.Errorf("swarm: %s:%d: %s: %g is negative", name, ln, Columns[i], x)
			}
			v[i] = x
		}
		if v[0] <= 0 {
			return nil, fmt.Errorf("swarm: %s:%d: %s: %g must be positive", name, ln, Columns[0], v[0])
		}
		if v[2] <= 0 {
			return nil, fmt.Errorf("swarm: %s:%d: %s: %g must be positive", name, ln, Columns[2], v[2])
		}
		if n := len(rows); n > 0 && v[0]*units.Townsend <= rows[n-1].ReducedField {
			return nil, fmt.Errorf("swarm: %s:%d: %s: %g Td is not above the previous row", name, ln, Columns[0], v[0])
		}
		row := Coefficients{
			ReducedField: v[0] * units.Townsend, MeanEnergy: v[1] * units.ElectronVolt,
			DriftVelocity: v[2], AlphaN: v[3], EtaN: v[4], Ionisation: v[5], Attachment: v[6],
			ExciteA: v[7], ExciteB: v[8], ExciteC: v[9],
		}
		for i, j := range optAt {
			if j < 0 {
				continue
			}
			if j >= len(rec) {
				return nil, fmt.Errorf("swarm: %s:%d: %s: missing (row has %d columns, the header %d)", name, ln, OptionalColumns[i], len(rec), len(head))
			}
			x, err := strconv.ParseFloat(strings.TrimSpace(rec[j]), 64)
			if err != nil || math.IsNaN(x) || math.IsInf(x, 0) {
				return nil, fmt.Errorf("swarm: %s:%d: %s: %q is not a finite number", name, ln, OptionalColumns[i], rec[j])
			}
			if x < 0 {
				return nil, fmt.Errorf("swarm: %s:%d: %s: %g is negative", name, ln, OptionalColumns[i], x)
			}
			setOptional(&row, i, x)
		}
		rows = append(rows, row)
	}
	if len(rows) == 0 {
		return nil, fmt.Errorf("swarm: %s: %w", name, ErrEmpty)
	}
	if len(rows) < 2 {
		return nil, fmt.Errorf("swarm: %s: table has 1 row, need at least 2", name)
	}
	t, err := NewTable(rows)
	if err != nil {
		return nil, fmt.Errorf("%w (in %s)", err, name)
	}
	return t, nil
}

// WriteCSV writes the table with the Columns and OptionalColumns header, E/N in Td and mean
// energy in eV, every number in the shortest form that reads back to the same float64.
func (t *Table) WriteCSV(w io.Writer) error {
	return writeCSV(w, nil, t.rows, nil, nil)
}

// writeCSV writes comment lines, the header (Columns, OptionalColumns, then extra names) and
// the rows with their extra values, each number in the shortest form that round-trips.
func writeCSV(w io.Writer, comments []string, rows []Coefficients, extraNames []string, extra [][]float64) error {
	bw := bufio.NewWriter(w)
	for _, c := range comments {
		fmt.Fprintf(bw, "# %s\n", c)
	}
	head := append(append([]string(nil), Columns...), OptionalColumns...)
	bw.WriteString(strings.Join(append(head, extraNames...), ","))
	bw.WriteByte('\n')
	for i, r := range rows {
		vals := []float64{r.ReducedField / units.Townsend, r.MeanEnergy / units.ElectronVolt,
			r.DriftVelocity, r.AlphaN, r.EtaN, r.Ionisation, r.Attachment, r.ExciteA, r.ExciteB, r.ExciteC}
		vals = append(vals, optionalValues(&r)...)
		if extra != nil {
			vals = append(vals, extra[i]...)
		}
		for k, v := range vals {
			if k > 0 {
				bw.WriteByte(',')
			}
			bw.WriteString(strconv.FormatFloat(v, 'g', -1, 64))
		}
		bw.WriteByte('\n')
	}
	return bw.Flush()
}

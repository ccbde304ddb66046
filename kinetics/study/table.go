package study

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"math"
	"reflect"
	"strconv"
	"strings"

	"n2pulse/internal/atomicfile"
	"n2pulse/kinetics"
)

// Fixed column names of a results table.
const (
	PointColumn  = "point"
	StatusColumn = "status"
	StatusOK     = "ok"
	// StatusTruncated marks a point whose pulse was still going at the longest time a run
	// may take (kinetics.Summary.Truncated): its numbers are cut short, never "ok".
	StatusTruncated = "truncated"
)

var summaryType = reflect.TypeFor[kinetics.Summary]()

// Metrics returns the names of the figures of merit of kinetics.Summary, in field order: the
// JSON names of `run --json` ("energy_total_J", "fwhm_s", …).
func Metrics() []string {
	names := make([]string, 0, summaryType.NumField())
	for i := range summaryType.NumField() {
		if n := tableName(summaryType.Field(i)); n != "" {
			names = append(names, n)
		}
	}
	return names
}

// tableName is the column name of a summary field in a results table, or "" for a field
// the table leaves out: unexported, marked "-", or a nested block such as the energy
// account or the regime checks (whose figures the summary also carries flat: loading,
// deposited energy, uniform_glow).
func tableName(f reflect.StructField) string {
	if k := f.Type.Kind(); k == reflect.Struct || (k == reflect.Slice && f.Type.Elem().Kind() == reflect.Struct) {
		return ""
	}
	return jsonName(f)
}

// NumericMetrics returns the metrics that are numbers (those that can be drawn).
func NumericMetrics() []string {
	var names []string
	for i := range summaryType.NumField() {
		f := summaryType.Field(i)
		if n := tableName(f); n != "" && (f.Type.Kind() == reflect.Float64 || f.Type.Kind() == reflect.Int) {
			names = append(names, n)
		}
	}
	return names
}

func jsonName(f reflect.StructField) string {
	if !f.IsExported() {
		return ""
	}
	tag := f.Tag.Get("json")
	name, _, _ := strings.Cut(tag, ",")
	if name == "-" {
		return ""
	}
	if name == "" {
		return f.Name
	}
	return name
}

// undefinedAtZero are the metrics that a shot without a pulse reports as 0 although they have
// no value (a width, a time of the pulse): tables leave them empty, as they leave NaN.
var undefinedAtZero = map[string]bool{
	"fwhm_s": true, "half_max_width_s": true, "rms_fwhm_s": true, "pulse_centre_s": true, "rise_s": true, "delay_s": true,
	"pulse_separation_s": true, "strongest_pulse_fwhm_s": true, "half_max_energy_share": true, "fwhm_45_s": true, "fwhm_55_s": true,
}

// summaryFields writes the metrics of s in the order of Metrics; an undefined value (NaN, or 0
// for the metrics of undefinedAtZero) is an empty cell.
func summaryFields(s kinetics.Summary) []string {
	v := reflect.ValueOf(s)
	out := make([]string, 0, v.NumField())
	for i := range v.NumField() {
		name := tableName(summaryType.Field(i))
		if name == "" {
			continue
		}
		f := v.Field(i)
		switch f.Kind() {
		case reflect.Float64:
			x := f.Float()
			if math.IsNaN(x) || math.IsInf(x, 0) || (x == 0 && undefinedAtZero[name]) {
				out = append(out, "")
				continue
			}
			out = append(out, formatNumber(x))
		case reflect.Int, reflect.Int64:
			out = append(out, strconv.FormatInt(f.Int(), 10))
		case reflect.Bool:
			out = append(out, strconv.FormatBool(f.Bool()))
		case reflect.String:
			out = append(out, f.String())
		case reflect.Slice:
			parts := make([]string, f.Len())
			for j := range parts {
				parts[j] = fmt.Sprint(f.Index(j).Interface())
			}
			out = append(out, strings.Join(parts, ";"))
		default:
			out = append(out, fmt.Sprint(f.Interface()))
		}
	}
	return out
}

// Table is a results table: a header and one row per point, in point order.
type Table struct {
	Columns []string
	Rows    [][]string
}

// Column returns the index of a named column, or −1.
func (t *Table) Column(name string) int {
	for i, c := range t.Columns {
		if c == name {
			return i
		}
	}
	return -1
}

// Float returns the number in row r under column c; NaN for an empty cell (a failed point).
func (t *Table) Float(r, c int) float64 {
	s := t.Rows[r][c]
	if s == "" {
		return math.NaN()
	}
	v, err := strconv.ParseFloat(s, 64)
	if err != nil {
		return math.NaN()
	}
	return v
}

// OK reports whether row r holds a computed point.
func (t *Table) OK(r int) bool {
	c := t.Column(StatusColumn)
	return c >= 0 && t.Rows[r][c] == StatusOK
}

// CSV returns the table as comma-separated values with a header line.
func (t *Table) CSV() []byte {
	var b bytes.Buffer
	w := csv.NewWriter(&b)
	w.Write(t.Columns)
	for _, r := range t.Rows {
		w.Write(r)
	}
	w.Flush()
	return b.Bytes()
}

// WriteCSV writes the table to path, atomically.
func (t *Table) WriteCSV(path string) error {
	if err := atomicfile.WriteFile(path, t.CSV()); err != nil {
		return fmt.Errorf("study: %w", err)
	}
	return nil
}

// DataFile is the name of the whitespace-separated copy of a two-key sweep's table, for plotting
// programs that read blocks (one block per value of the first key, blank lines between).
const DataFile = "results.dat"

// Blocks returns the numeric columns of the table (point, varied keys, numeric metrics, lases as
// 1 or 0) separated by spaces, under a "#" header line naming them, with an empty cell written
// NaN and a blank line after every n rows: the layout that surface plotters read as a grid
// (n is the number of values of the last, fastest key).
func (t *Table) Blocks(n int) []byte {
	numeric := map[string]bool{PointColumn: true, "lases": true}
	for _, m := range NumericMetrics() {
		numeric[m] = true
	}
	var cols []int
	var head []string
	for i, c := range t.Columns {
		if numeric[c] || strings.Contains(c, " [") || strings.Contains(c, ".") {
			cols = append(cols, i)
			head = append(head, strings.ReplaceAll(c, " ", ""))
		}
	}
	var b bytes.Buffer
	b.WriteString("# " + strings.Join(head, " ") + "\n")
	b.WriteString("# SI units; NaN: no value (failed point or undefined); lases: 1 yes, 0 no\n")
	for r, row := range t.Rows {
		for k, i := range cols {
			if k > 0 {
				b.WriteByte(' ')
			}
			switch v := row[i]; {
			case v == "":
				b.WriteString("NaN")
			case v == "true":
				b.WriteByte('1')
			case v == "false":
				b.WriteByte('0')
			default:
				b.WriteString(v)
			}
		}
		b.WriteByte('\n')
		if n > 0 && (r+1)%n == 0 && r+1 < len(t.Rows) {
			b.WriteByte('\n')
		}
	}
	return b.Bytes()
}

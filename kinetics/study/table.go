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
// account (whose figures the summary also carries flat: loading, deposited energy).
func tableName(f reflect.StructField) string {
	if f.Type.Kind() == reflect.Struct {
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

// summaryFields writes the metrics of s in the order of Metrics.
func summaryFields(s kinetics.Summary) []string {
	v := reflect.ValueOf(s)
	out := make([]string, 0, v.NumField())
	for i := range v.NumField() {
		if tableName(summaryType.Field(i)) == "" {
			continue
		}
		f := v.Field(i)
		switch f.Kind() {
		case reflect.Float64:
			out = append(out, formatNumber(f.Float()))
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

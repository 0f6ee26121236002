// Package limits holds the size limits peerpack applies to every input, so
// that a broken or hostile file is refused with a clear message before it
// costs memory, and a user with a genuinely larger dataset can raise the one
// limit in the way (`--limit rows=20M`).
//
// The defaults admit a world-sized dataset (21,500 institutions, 20
// indicators, 10 years: 4.3 million rows in long shape, about 110 MB of
// CSV) with room to spare, and stop a file long before it could exhaust
// the memory of an ordinary laptop.
package limits

import (
	"errors"
	"fmt"
	"strconv"
	"strings"

	"peerpack/internal/yamlx"
)

// Limits are the caps on inputs. Every field is positive; a zero field
// means "the default" (see Default and Or).
type Limits struct {
	// FileBytes caps one data file (a CSV file, an XLSX workbook, and each
	// XLSX part and all parts together once inflated).
	FileBytes int64
	// Rows caps the data rows of one file or sheet (the header not counted).
	Rows int64
	// Columns caps the columns of one file or sheet, header and rows alike.
	Columns int64
	// CellBytes caps one field of a CSV file or one cell of a sheet.
	CellBytes int64
	// SheetCells caps rows x columns of one XLSX sheet, which is held in
	// memory whole (a CSV file is read row by row).
	SheetCells int64
	// Institutions caps the register's rows.
	Institutions int64
	// Indicators caps the dictionary's entries.
	Indicators int64
	// Years caps the distinct years in the values.
	Years int64
	// Values caps the dense table the dataset is stored in: institutions x
	// indicators x years (8 bytes each, plus 8 while loading).
	Values int64
	// Groups caps the peer groups of a brief after `each` is expanded.
	Groups int64
	// Charts caps the chart blocks of a brief.
	Charts int64
	// Blocks caps the fenced blocks of a brief (charts, tables, commentary
	// and the rest together).
	Blocks int64
	// YAMLBytes, YAMLDepth, YAMLScalar and YAMLNodes cap one YAML document
	// (front matter, a block, the dictionary); the defaults are yamlx's.
	YAMLBytes  int64
	YAMLDepth  int64
	YAMLScalar int64
	YAMLNodes  int64
	// RecordBytes, RecordRows and RecordKeys cap one record file (papers or
	// votes), read as a stream: its size, its data rows, and the distinct
	// names (institutions, fields, types, countries) held while reading.
	RecordBytes int64
	RecordRows  int64
	RecordKeys  int64
}

// Default returns the limits used when none are given.
func Default() Limits {
	return Limits{
		FileBytes:    1 << 30, // 1 GiB; the world-sized long CSV is about 110 MB
		Rows:         10_000_000,
		Columns:      4096,
		CellBytes:    64 << 10,   // 64 KiB; a spreadsheet cell holds at most 32,767 characters
		SheetCells:   20_000_000, // the world in wide shape is 215,000 x 22 = 4.7 million
		Institutions: 200_000,
		Indicators:   2000,
		Years:        100,
		Values:       50_000_000, // 400 MB stored (800 MB while loading); the world is 4.3 million
		Groups:       1000,
		Charts:       500,
		Blocks:       2000,
		YAMLBytes:    yamlx.MaxBytes,
		YAMLDepth:    yamlx.MaxDepth,
		YAMLScalar:   yamlx.MaxScalar,
		YAMLNodes:    yamlx.MaxNodes,
		// A world of 11.3 million papers with three affiliations each is
		// about 34 million rows and 1.5 GiB in one-row-per-affiliation shape.
		RecordBytes: 64 << 30,
		RecordRows:  200_000_000,
		RecordKeys:  5_000_000,
	}
}

// Or returns l with every zero (unset) field taken from Default, so that a
// zero Limits behaves as the defaults.
func (l Limits) Or() Limits {
	d := Default()
	for _, s := range specs {
		if p := s.field(&l); *p <= 0 {
			*p = *s.field(&d)
		}
	}
	return l
}

// spec describes one limit for Parse, messages and documentation.
type spec struct {
	name  string // as written after --limit
	unit  string // "bytes" or the plural noun counted
	bytes bool   // K/M/G are powers of 1024
	doc   string
	field func(*Limits) *int64
}

// specs lists every limit in documentation order.
var specs = []spec{
	{"file", "bytes", true, "size of one data file (and of an XLSX workbook once inflated)", func(l *Limits) *int64 { return &l.FileBytes }},
	{"rows", "rows", false, "data rows of one file or sheet", func(l *Limits) *int64 { return &l.Rows }},
	{"columns", "columns", false, "columns of one file or sheet", func(l *Limits) *int64 { return &l.Columns }},
	{"cell", "bytes", true, "length of one field or cell", func(l *Limits) *int64 { return &l.CellBytes }},
	{"sheet-cells", "cells", false, "rows x columns of one XLSX sheet", func(l *Limits) *int64 { return &l.SheetCells }},
	{"institutions", "institutions", false, "rows of the register", func(l *Limits) *int64 { return &l.Institutions }},
	{"indicators", "indicators", false, "entries of the dictionary", func(l *Limits) *int64 { return &l.Indicators }},
	{"years", "years", false, "distinct years in the values", func(l *Limits) *int64 { return &l.Years }},
	{"values", "values", false, "institutions x indicators x years held in memory", func(l *Limits) *int64 { return &l.Values }},
	{"groups", "groups", false, "peer groups of a brief, after each: is expanded", func(l *Limits) *int64 { return &l.Groups }},
	{"charts", "charts", false, "chart blocks of a brief", func(l *Limits) *int64 { return &l.Charts }},
	{"blocks", "blocks", false, "fenced blocks of a brief", func(l *Limits) *int64 { return &l.Blocks }},
	{"yaml", "bytes", true, "size of one YAML document", func(l *Limits) *int64 { return &l.YAMLBytes }},
	{"yaml-depth", "levels", false, "nesting of one YAML document", func(l *Limits) *int64 { return &l.YAMLDepth }},
	{"yaml-scalar", "bytes", true, "length of one YAML value", func(l *Limits) *int64 { return &l.YAMLScalar }},
	{"yaml-nodes", "nodes", false, "nodes of one YAML document", func(l *Limits) *int64 { return &l.YAMLNodes }},
	{"record-file", "bytes", true, "size of one paper or vote record file", func(l *Limits) *int64 { return &l.RecordBytes }},
	{"record-rows", "rows", false, "data rows of one paper or vote record file", func(l *Limits) *int64 { return &l.RecordRows }},
	{"record-keys", "names", false, "distinct institutions, fields, types and countries in one record file", func(l *Limits) *int64 { return &l.RecordKeys }},
}

// Name identifies one limit by the name written after --limit.
type Name string

// The limit names, as Parse accepts them and messages print them.
const (
	FileBytes    Name = "file"
	Rows         Name = "rows"
	Columns      Name = "columns"
	CellBytes    Name = "cell"
	SheetCells   Name = "sheet-cells"
	Institutions Name = "institutions"
	Indicators   Name = "indicators"
	Years        Name = "years"
	Values       Name = "values"
	Groups       Name = "groups"
	Charts       Name = "charts"
	Blocks       Name = "blocks"
	YAMLBytes    Name = "yaml"
	YAMLDepth    Name = "yaml-depth"
	YAMLScalar   Name = "yaml-scalar"
	YAMLNodes    Name = "yaml-nodes"
	RecordBytes  Name = "record-file"
	RecordRows   Name = "record-rows"
	RecordKeys   Name = "record-keys"
)

func lookup(name Name) (spec, bool) {
	for _, s := range specs {
		if s.name == string(name) {
			return s, true
		}
	}
	return spec{}, false
}

// Get returns the value of a limit by name (0 for an unknown name).
func (l Limits) Get(name Name) int64 {
	s, ok := lookup(name)
	if !ok {
		return 0
	}
	return *s.field(&l)
}

// Names lists the limit names in documentation order.
func Names() []Name {
	out := make([]Name, len(specs))
	for i, s := range specs {
		out[i] = Name(s.name)
	}
	return out
}

// Describe returns one line per limit: name, default and what it caps,
// for `--help` and the README.
func Describe() []string {
	d := Default()
	out := make([]string, len(specs))
	for i, s := range specs {
		out[i] = fmt.Sprintf("%-13s %s %s: %s", s.name, Group(*s.field(&d)), s.unit, s.doc)
	}
	return out
}

// Parse reads overrides written name=value[,name=value...] on top of the
// defaults, e.g. "rows=20M,cell=1MiB". Values are whole numbers, optionally
// with a suffix: for sizes in bytes K, M and G (also KB/KiB, ...) are
// powers of 1024; for counts they are thousand, million and billion.
// Underscores and commas between digit groups are not accepted, since a
// comma separates overrides.
func Parse(s string) (Limits, error) {
	return Default().Parse(s)
}

// Parse applies overrides to l; see the package-level Parse.
func (l Limits) Parse(s string) (Limits, error) {
	for _, part := range strings.Split(s, ",") {
		part = strings.TrimSpace(part)
		if part == "" {
			continue
		}
		name, val, ok := strings.Cut(part, "=")
		name = strings.ToLower(strings.TrimSpace(name))
		if !ok {
			return l, fmt.Errorf("limit %q has no value; write name=value, e.g. rows=20M (limits: %s)", part, nameList())
		}
		sp, known := lookup(Name(name))
		if !known {
			msg := fmt.Sprintf("unknown limit %q", name)
			if near := yamlx.Nearest(name, stringNames()); near != "" {
				msg += fmt.Sprintf("; did you mean %q?", near)
			}
			return l, fmt.Errorf("%s (limits: %s)", msg, nameList())
		}
		n, err := parseValue(strings.TrimSpace(val), sp.bytes)
		if err != nil {
			return l, fmt.Errorf("limit %s=%s: %v", name, strings.TrimSpace(val), err)
		}
		*sp.field(&l) = n
	}
	return l, nil
}

// maxValue keeps every product of limits (rows x columns, institutions x
// indicators x years) far from overflowing an int64.
const maxValue = 1 << 40

func parseValue(v string, bytes bool) (int64, error) {
	if v == "" {
		return 0, fmt.Errorf("the value is empty; write a whole number, e.g. 20M")
	}
	num := strings.TrimRight(v, "KMGkmgiIbB")
	suffix := strings.ToUpper(v[len(num):])
	base := int64(1000)
	if bytes {
		base = 1024
	}
	mult := int64(1)
	switch strings.TrimSuffix(strings.TrimSuffix(suffix, "B"), "I") {
	case "":
	case "K":
		mult = base
	case "M":
		mult = base * base
	case "G":
		mult = base * base * base
	default:
		return 0, fmt.Errorf("unknown suffix %q; use K, M or G", v[len(num):])
	}
	if !bytes && strings.HasSuffix(suffix, "B") {
		return 0, fmt.Errorf("this limit counts %s, not bytes; write K, M or G without B", "items")
	}
	if suffix == "IB" || (strings.Contains(suffix, "I") && !strings.HasSuffix(suffix, "IB")) {
		return 0, fmt.Errorf("unknown suffix %q; use K, M or G", v[len(num):])
	}
	n, err := strconv.ParseInt(num, 10, 64)
	if errors.Is(err, strconv.ErrRange) && num != "" && strings.Trim(num, "0123456789") == "" {
		// Digits, only too many of them for any count or size.
		return 0, fmt.Errorf("%s is larger than any input peerpack can hold; the most is %s", v, Group(maxValue))
	}
	if err != nil {
		return 0, fmt.Errorf("%q is not a whole number; write digits with an optional K, M or G, e.g. 20M", v)
	}
	if n < 1 {
		return 0, fmt.Errorf("a limit must be at least 1")
	}
	if n > maxValue/mult {
		return 0, fmt.Errorf("%s is larger than any input peerpack can hold; the most is %s", v, Group(maxValue))
	}
	return n * mult, nil
}

func stringNames() []string {
	out := make([]string, len(specs))
	for i, s := range specs {
		out[i] = s.name
	}
	return out
}

func nameList() string { return strings.Join(stringNames(), ", ") }

// Group writes n with commas between thousands (5,000,000). It is here, not
// in internal/format, because format imports the dataset, which imports
// this package.
func Group(n int64) string {
	s := strconv.FormatInt(n, 10)
	neg := strings.HasPrefix(s, "-")
	s = strings.TrimPrefix(s, "-")
	var b strings.Builder
	if neg {
		b.WriteByte('-')
	}
	for i, c := range s {
		if i > 0 && (len(s)-i)%3 == 0 {
			b.WriteByte(',')
		}
		b.WriteRune(c)
	}
	return b.String()
}

// YAML returns the YAML limits in the form internal/yamlx takes.
func (l Limits) YAML() yamlx.Limits {
	l = l.Or()
	return yamlx.Limits{Bytes: int(l.YAMLBytes), Depth: int(l.YAMLDepth), Scalar: int(l.YAMLScalar), Nodes: int(l.YAMLNodes)}
}

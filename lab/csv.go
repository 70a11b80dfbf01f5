package lab

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"math"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// record is one non-blank CSV row, its cells trimmed of spaces.
type record struct {
	line  int
	cells []string
}

// splitRecords decodes a file's bytes into records: it strips a UTF-8 BOM, refuses other
// encodings, drops '#' comment lines and blank rows (also rows of empty cells, as
// spreadsheets export them), and accepts LF or CRLF line ends.
func splitRecords(file string, data []byte) ([]record, error) {
	if bytes.HasPrefix(data, []byte{0xFF, 0xFE}) || bytes.HasPrefix(data, []byte{0xFE, 0xFF}) {
		return nil, &ParseError{File: file, Err: ErrSyntax, Msg: "file is UTF-16 text; expected UTF-8",
			Hint: `save it as "CSV UTF-8 (comma delimited)"`}
	}
	data = bytes.TrimPrefix(data, []byte{0xEF, 0xBB, 0xBF})
	if !utf8.Valid(data) {
		line := 1 + bytes.Count(data[:firstInvalid(data)], []byte{'\n'})
		return nil, &ParseError{File: file, Line: line, Err: ErrSyntax, Msg: "text is not valid UTF-8",
			Hint: `an older spreadsheet encoding (such as Latin-1 for "°F"); save the file as "CSV UTF-8"`}
	}
	// Blank out comment lines, keeping their line ends so that line numbers stay true.
	clean := make([]byte, 0, len(data))
	for rest := data; len(rest) > 0; {
		i := bytes.IndexByte(rest, '\n')
		line := rest
		if i >= 0 {
			line, rest = rest[:i+1], rest[i+1:]
		} else {
			rest = nil
		}
		if t := bytes.TrimSpace(line); len(t) > 0 && t[0] == '#' {
			if i >= 0 {
				clean = append(clean, '\n')
			}
			continue
		}
		clean = append(clean, line...)
	}
	r := csv.NewReader(bytes.NewReader(clean))
	r.FieldsPerRecord = -1
	r.ReuseRecord = false
	var out []record
	for {
		cells, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			pe := &ParseError{File: file, Err: ErrSyntax, Msg: err.Error(),
				Hint: `a cell holding a comma or a quote must be enclosed in double quotes, with inner quotes doubled ("")`}
			var ce *csv.ParseError
			if errors.As(err, &ce) {
				pe.Line = ce.Line
				pe.Msg = ce.Err.Error()
			}
			return nil, pe
		}
		line, _ := r.FieldPos(0)
		n := 0
		for i, c := range cells {
			cells[i] = strings.TrimSpace(c)
			if cells[i] != "" {
				n = i + 1
			}
		}
		if n == 0 {
			continue
		}
		out = append(out, record{line: line, cells: cells})
	}
	return out, nil
}

// trimTrailing drops empty cells at the end of a row.
func trimTrailing(cells []string) []string {
	n := len(cells)
	for n > 0 && cells[n-1] == "" {
		n--
	}
	return cells[:n]
}

func firstInvalid(b []byte) int {
	for i := 0; i < len(b); {
		r, size := utf8.DecodeRune(b[i:])
		if r == utf8.RuneError && size == 1 {
			return i
		}
		i += size
	}
	return len(b)
}

// splitHeader splits a header cell "name [unit]" into its name and unit. ok is false when
// the cell has an opening bracket without a closing one at its end.
func splitHeader(cell string) (name, unit string, hasUnit, ok bool) {
	i := strings.IndexByte(cell, '[')
	if i < 0 {
		if strings.ContainsRune(cell, ']') {
			return cell, "", false, false
		}
		return strings.TrimSpace(cell), "", false, true
	}
	if !strings.HasSuffix(cell, "]") || strings.Count(cell, "[") != 1 || strings.Count(cell, "]") != 1 {
		return cell, "", false, false
	}
	return strings.TrimSpace(cell[:i]), strings.TrimSpace(cell[i+1 : len(cell)-1]), true, true
}

// normName folds a column name or key for comparison: lower case, '_' and '-' as spaces,
// runs of spaces as one.
func normName(s string) string {
	s = strings.Map(func(r rune) rune {
		if r == '_' || r == '-' {
			return ' '
		}
		return unicode.ToLower(r)
	}, s)
	return strings.Join(strings.Fields(s), " ")
}

// colSpec describes one column a table accepts.
type colSpec struct {
	name     string   // canonical name, as written by WriteFolder
	synonyms []string // further accepted names
	q        Quantity
	text     bool // a text column: no number, no unit
	required bool
	lo, hi   float64 // accepted range in field units; lo is exclusive when loOpen
	loOpen   bool
}

func (c colSpec) matches(n string) bool {
	if normName(c.name) == n {
		return true
	}
	for _, s := range c.synonyms {
		if normName(s) == n {
			return true
		}
	}
	return false
}

// boundCol is a column of a table as found in the header.
type boundCol struct {
	spec   colSpec
	index  int // cell index; -1 when the file lacks the column
	header string
	unit   unitDef
}

// table is a parsed CSV table: its header bound to the column specs, and its data rows.
type table struct {
	file       string
	headerLine int
	width      int
	cols       map[string]*boundCol // by canonical name
	rows       []record
}

func specNames(specs []colSpec) string {
	var names []string
	for _, s := range specs {
		names = append(names, s.name)
	}
	return strings.Join(names, ", ")
}

// parseTable binds the header of recs to specs and checks every row's cell count.
func parseTable(file string, recs []record, specs []colSpec) (*table, error) {
	if len(recs) == 0 {
		return nil, &ParseError{File: file, Err: ErrEmpty, Msg: "file has no header and no data",
			Hint: "the first line names the columns, such as: " + exampleHeader(specs)}
	}
	h := recs[0]
	h.cells = trimTrailing(h.cells)
	t := &table{file: file, headerLine: h.line, width: len(h.cells), cols: map[string]*boundCol{}, rows: recs[1:]}
	if len(h.cells) == 1 && strings.Contains(h.cells[0], ";") {
		return nil, &ParseError{File: file, Line: h.line, Err: ErrSyntax, Msg: "header is one cell holding semicolons",
			Hint: "the file looks semicolon-separated; save it comma-separated with a point as the decimal separator"}
	}
	if _, err := strconv.ParseFloat(h.cells[0], 64); err == nil {
		return nil, &ParseError{File: file, Line: h.line, Err: ErrMissingColumn, Msg: "first line holds numbers, not column names",
			Hint: "start the file with a header line such as: " + exampleHeader(specs)}
	}
	for i, cell := range h.cells {
		pe := &ParseError{File: file, Line: h.line, Column: i + 1, Header: cell}
		name, unit, hasUnit, ok := splitHeader(cell)
		if !ok {
			pe.Err, pe.Msg = ErrUnknownColumn, fmt.Sprintf("header cell %q is not of the form name [unit]", cell)
			return nil, pe
		}
		var spec *colSpec
		n := normName(name)
		for k := range specs {
			if specs[k].matches(n) {
				spec = &specs[k]
				break
			}
		}
		if spec == nil {
			pe.Err = ErrUnknownColumn
			if name == "" {
				pe.Msg = "empty column name (accepted: " + specNames(specs) + ")"
			} else {
				pe.Msg = fmt.Sprintf("unknown column %q (accepted: %s)", name, specNames(specs))
			}
			if j := strings.IndexByte(name, '('); j > 0 && strings.HasSuffix(name, ")") {
				pe.Hint = fmt.Sprintf("write the unit in square brackets: %s [%s]", strings.TrimSpace(name[:j]), name[j+1:len(name)-1])
			}
			return nil, pe
		}
		if prev, dup := t.cols[spec.name]; dup {
			pe.Err = ErrDuplicateKey
			pe.Msg = fmt.Sprintf("column %s is given twice (cells %d and %d)", spec.name, prev.index+1, i+1)
			return nil, pe
		}
		bc := &boundCol{spec: *spec, index: i, header: cell}
		switch {
		case spec.text:
			if hasUnit && unit != "" {
				pe.Err, pe.Msg = ErrUnknownUnit, fmt.Sprintf("column %s holds text and takes no unit", spec.name)
				return nil, pe
			}
		default:
			u, ok := lookupUnit(spec.q, unit)
			if !ok {
				ue := unitError(spec.q, unit)
				pe.Err, pe.Msg, pe.Hint = ue.Err, ue.Msg, ue.Hint
				if ue.Err == ErrMissingUnit {
					pe.Msg = fmt.Sprintf("column %s needs a unit (accepted: %s)", spec.name, acceptedUnits(spec.q))
					pe.Hint = fmt.Sprintf("write it as %s [%s]", name, spec.q.FieldUnit())
				}
				return nil, pe
			}
			bc.unit = u
		}
		t.cols[spec.name] = bc
	}
	for _, s := range specs {
		if s.required && t.cols[s.name] == nil {
			return nil, &ParseError{File: file, Line: h.line, Err: ErrMissingColumn,
				Msg:  fmt.Sprintf("no %s column (required: %s)", s.name, requiredNames(specs)),
				Hint: "names are case-insensitive; accepted names of this column: " + strings.Join(append([]string{s.name}, s.synonyms...), ", ")}
		}
	}
	if len(t.rows) == 0 {
		return nil, &ParseError{File: file, Line: h.line, Err: ErrEmpty, Msg: "header without data rows"}
	}
	// Spreadsheets pad rows with empty cells, which carry nothing; but they pad the header or
	// every row alike. A row longer than both the header and the shortest row, its extra
	// cells empty, is a number split by a decimal comma in front of an empty optional
	// column: taking the empty cell for padding would shift every value after the comma.
	padded := len(h.cells)
	if raw := len(recs[0].cells); raw > padded {
		padded = raw
	}
	shortest := len(t.rows[0].cells)
	for _, r := range t.rows {
		shortest = min(shortest, len(r.cells))
	}
	padded = max(padded, shortest)
	for k, r := range t.rows {
		if len(r.cells) > t.width && len(trimTrailing(r.cells)) <= t.width {
			if len(r.cells) > padded {
				return nil, &ParseError{File: file, Line: r.line, Err: ErrRagged,
					Msg: fmt.Sprintf("expected %d cells as in the header (line %d), got %d; the extra cells are empty but not a spreadsheet's padding (the header has %d cells, the shortest row %d)",
						t.width, h.line, len(r.cells), len(recs[0].cells), shortest),
					Hint: "a decimal comma splits a number in two and shifts the values after it: use a point (12.5); if the row is only padded, remove its trailing commas"}
			}
			t.rows[k].cells = r.cells[:t.width]
			continue
		}
		if len(r.cells) != t.width {
			pe := &ParseError{File: file, Line: r.line, Err: ErrRagged,
				Msg: fmt.Sprintf("expected %d cells as in the header (line %d), got %d", t.width, h.line, len(r.cells))}
			if len(r.cells) > t.width {
				pe.Hint = "a decimal comma splits a number in two: use a point (12.5)"
			}
			return nil, pe
		}
	}
	return t, nil
}

func requiredNames(specs []colSpec) string {
	var names []string
	for _, s := range specs {
		if s.required {
			names = append(names, s.name)
		}
	}
	return strings.Join(names, ", ")
}

func exampleHeader(specs []colSpec) string {
	var cells []string
	for _, s := range specs {
		if !s.required {
			continue
		}
		if s.text || !s.q.needsUnit() {
			cells = append(cells, s.name)
		} else {
			cells = append(cells, s.name+" ["+s.q.FieldUnit()+"]")
		}
	}
	return strings.Join(cells, ",")
}

// text returns the trimmed text of a column in r, "" when the table lacks it.
func (t *table) text(r record, name string) string {
	c := t.cols[name]
	if c == nil {
		return ""
	}
	return r.cells[c.index]
}

// num returns a column's value in r in field units, checked against the column's range.
// An absent column or an empty optional cell gives 0 ("not reported").
func (t *table) num(r record, name string) (float64, error) {
	c := t.cols[name]
	if c == nil {
		return 0, nil
	}
	cell := r.cells[c.index]
	if cell == "" && !c.spec.required {
		return 0, nil
	}
	return convertCell(t.file, r.line, c.index+1, c.header, cell, c.spec, c.unit)
}

// convertCell parses cell, converts it from unit u to field units and checks the range of
// spec. A value of exactly 0 in an optional column means "not reported" and is accepted.
func convertCell(file string, line, col int, header, cell string, spec colSpec, u unitDef) (float64, error) {
	pe := &ParseError{File: file, Line: line, Column: col, Header: header}
	v, err := parseNumber(cell)
	if err != nil {
		pe.Err, pe.Msg, pe.Hint = err.Err, err.Msg, err.Hint
		return 0, pe
	}
	if v == 0 && !spec.required && u.offset == 0 {
		return 0, nil
	}
	f := u.scale*v + u.offset
	if math.IsNaN(f) || math.IsInf(f, 0) {
		pe.Err, pe.Msg = ErrNotFinite, fmt.Sprintf("%s is too large for this unit", cell)
		return 0, pe
	}
	if spec.loOpen && f > spec.lo || !spec.loOpen && f >= spec.lo {
		if f <= spec.hi {
			return f, nil
		}
	}
	pe.Err = ErrRange
	unit := u.name
	shown := cell + " " + unit
	if u.scale != 1 || u.offset != 0 {
		shown += " (" + fmtNum(roundTo(f, 3)) + " " + spec.q.FieldUnit() + ")"
	}
	pe.Msg = fmt.Sprintf("%s is outside the accepted range %s", strings.TrimSpace(shown), rangeText(spec))
	switch spec.q {
	case Pressure:
		if f <= 0 {
			pe.Msg = fmt.Sprintf("%s; an absolute pressure must be above 0 psia", shown)
			switch {
			case u.gauge:
				pe.Hint = fmt.Sprintf("a gauge pressure is read from one atmosphere, so %s %s is below vacuum; was it an absolute pressure?", cell, unit)
			case v == 0:
				pe.Hint = "0 psia is a vacuum; an atmospheric stage is 0 psig = 14.696 psia"
			}
		}
	case Temperature:
		pe.Hint = temperatureHint(u, v)
	}
	return 0, pe
}

// temperatureHint recognises a °C value in a °F column and the reverse.
func temperatureHint(u unitDef, v float64) string {
	switch {
	case u.name == "degF" && v < 40:
		return "this looks like a °C value: was the unit degC?"
	case u.name == "degC" && v > 200:
		return "this looks like a °F value: was the unit degF?"
	}
	return ""
}

func roundTo(v float64, digits int) float64 {
	p := math.Pow(10, float64(digits))
	return math.Round(v*p) / p
}

func rangeText(spec colSpec) string {
	lo := "≥ "
	if spec.loOpen {
		lo = "> "
	}
	unit := spec.q.FieldUnit()
	if unit != "" && spec.q != APIGravity {
		unit = " " + unit
	} else if spec.q == APIGravity {
		unit = " °API"
	}
	if math.IsInf(spec.hi, 1) {
		return lo + fmtNum(spec.lo) + unit
	}
	return lo + fmtNum(spec.lo) + " and ≤ " + fmtNum(spec.hi) + unit
}

// parseNumber reads a plain number cell. It refuses NaN and ±Inf and explains the common
// slips: a decimal comma, a unit written in the cell.
func parseNumber(cell string) (float64, *ParseError) {
	if cell == "" {
		return 0, &ParseError{Err: ErrNumber, Msg: "empty cell; expected a number"}
	}
	v, err := strconv.ParseFloat(cell, 64)
	switch {
	case err == nil && (math.IsNaN(v) || math.IsInf(v, 0)):
		return 0, &ParseError{Err: ErrNotFinite, Msg: fmt.Sprintf("%q is not a finite number", cell),
			Hint: "leave the cell empty when a value was not measured"}
	case err == nil:
		return v, nil
	case isRangeErr(err):
		return 0, &ParseError{Err: ErrNotFinite, Msg: fmt.Sprintf("%q is beyond the range of numbers", cell)}
	}
	pe := &ParseError{Err: ErrNumber, Msg: fmt.Sprintf("%q is not a number; expected a number such as 1234.5 or 1.2e3", truncate(cell, 40))}
	switch {
	case strings.Count(cell, ",") == 1 && !strings.Contains(cell, "."):
		pe.Hint = "use a point as the decimal separator (12.5, not 12,5)"
	case strings.ContainsAny(cell, ",'") || strings.Count(cell, " ") > 0 && allDigitsSpaces(cell):
		pe.Hint = "write numbers without thousands separators (12500, not 12,500)"
	default:
		for i := len(cell) - 1; i > 0; i-- {
			if _, err := strconv.ParseFloat(strings.TrimSpace(cell[:i]), 64); err == nil {
				if isUnitName(strings.TrimSpace(cell[i:])) {
					pe.Hint = "write the unit in the header, as name [unit], and only the number in the cell"
				}
				break
			}
		}
	}
	return 0, pe
}

func allDigitsSpaces(s string) bool {
	for _, r := range s {
		if (r < '0' || r > '9') && r != ' ' && r != '.' {
			return false
		}
	}
	return true
}

func truncate(s string, n int) string {
	if utf8.RuneCountInString(s) <= n {
		return s
	}
	r := []rune(s)
	return string(r[:n]) + "…"
}

// isUnitName reports whether s names a unit of some quantity ("psia", "degC", "sm3/sm3").
func isUnitName(s string) bool {
	for q := Quantity(0); q < numQuantities; q++ {
		if q == Dimensionless {
			continue
		}
		if _, err := CanonicalUnit(q, s); err == nil {
			return true
		}
	}
	return false
}

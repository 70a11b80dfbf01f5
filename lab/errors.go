package lab

import (
	"errors"
	"strconv"
	"strings"
)

// Sentinel errors. Every error of the reader is a *ParseError that wraps one of them; test
// with errors.Is.
var (
	// ErrMissingFile means the folder, fluid.csv or dl.csv does not exist.
	ErrMissingFile = errors.New("lab: missing file")
	// ErrMissingColumn means a required column (or a required fluid.csv key) is absent.
	ErrMissingColumn = errors.New("lab: missing column")
	// ErrUnknownColumn means a header cell (or a fluid.csv key) is not a known name.
	ErrUnknownColumn = errors.New("lab: unknown column")
	// ErrUnknownUnit means a unit is not one of the accepted units of the quantity.
	ErrUnknownUnit = errors.New("lab: unknown unit")
	// ErrMissingUnit means a quantity with units was given without one.
	ErrMissingUnit = errors.New("lab: missing unit")
	// ErrNumber means a cell does not hold a number.
	ErrNumber = errors.New("lab: not a number")
	// ErrNotFinite means a number is NaN, infinite or beyond float64.
	ErrNotFinite = errors.New("lab: number not finite")
	// ErrRange means a number is outside the physically possible range.
	ErrRange = errors.New("lab: value out of range")
	// ErrOrder means rows are out of the required order (DL pressures must decrease).
	ErrOrder = errors.New("lab: rows out of order")
	// ErrDuplicateKey means a key, column or stage is given twice.
	ErrDuplicateKey = errors.New("lab: duplicate key")
	// ErrRagged means a row does not have as many cells as the header.
	ErrRagged = errors.New("lab: wrong number of cells")
	// ErrEmpty means a file has no data rows.
	ErrEmpty = errors.New("lab: no data")
	// ErrTooLarge means a file is larger than MaxFileSize.
	ErrTooLarge = errors.New("lab: file too large")
	// ErrMismatch means two files disagree in a way that points to a slip.
	ErrMismatch = errors.New("lab: files disagree")
	// ErrSyntax means a file is not readable as UTF-8 comma-separated text (bad quoting,
	// another encoding, another separator).
	ErrSyntax = errors.New("lab: not readable as CSV")
)

// ParseError reports a problem in a report folder, where it is and, for a recognisable
// slip, how to fix it. Its Error method reads
//
//	lab: dl.csv:7:2 (Rsd [scf/STB]): "12,5" is not a number; expected a number such as 1234.5 or 1.2e3; hint: use a point as the decimal separator (12.5, not 12,5)
//
// Unwrap returns Err, always one of the sentinel errors of this package.
type ParseError struct {
	File   string // file name inside the report folder; "" for a value outside any file
	Line   int    // 1-based line; 0 when the error concerns the whole file
	Column int    // 1-based cell (field) number; 0 when the error concerns a whole line or file
	Header string // header cell (or fluid.csv key) of the column, as written
	Err    error  // sentinel: ErrNumber, ErrUnknownUnit, …
	Msg    string // what was wrong and what was expected; Err's text when empty
	Hint   string // suggested fix of a recognisable slip; may be empty
}

func (e *ParseError) Error() string {
	var b strings.Builder
	b.WriteString("lab: ")
	loc := e.File
	if e.Line > 0 {
		loc += ":" + strconv.Itoa(e.Line)
		if e.Column > 0 {
			loc += ":" + strconv.Itoa(e.Column)
		}
	}
	b.WriteString(loc)
	if e.Header != "" {
		if loc != "" {
			b.WriteByte(' ')
		}
		b.WriteString("(" + e.Header + ")")
	}
	if loc != "" || e.Header != "" {
		b.WriteString(": ")
	}
	msg := e.Msg
	if msg == "" && e.Err != nil {
		msg = strings.TrimPrefix(e.Err.Error(), "lab: ")
	}
	b.WriteString(msg)
	if e.Hint != "" {
		b.WriteString("; hint: " + e.Hint)
	}
	return b.String()
}

// Unwrap returns the sentinel error.
func (e *ParseError) Unwrap() error { return e.Err }

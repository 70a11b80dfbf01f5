package lab

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"os"
	"strconv"
	"strings"
)

// A survey file is a regional PVT database: one sample per row, in a single CSV file with the
// conventions of the report tables (UTF-8, optional BOM, '#' comment lines, blank lines
// ignored, header cells "name [unit]", DESIGN.md §3). Required columns: temperature, API,
// gas gravity, Rsb and Pb. Optional: sample, Bob, dead oil viscosity, oil viscosity at Pb,
// separator pressure, separator temperature, and the text columns well, reservoir and note
// (read and ignored). For example:
//
//	sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psia],Bob [rb/STB]
//	TR-3 A,196,30.4,0.82,612,2415,1.352
//	TR-7 B,212,41.8,0.78,1390,4120,
//
// The gas gravity is the surface gas gravity of the sample as the database gives it; the
// families that take the first-stage separator gas (Vasquez–Beggs, Kartoatmodjo–Schmidt) or the
// gas of the separator stages (Valkó–McCain) are given the same value, as when a report lacks
// the separator test.
//
// The file's structure is checked as a report's is: an unknown column, a missing unit, a cell
// that is not a number, a row with the wrong number of cells is a *ParseError naming the file,
// line and column, and nothing is returned. A value outside physical bounds, or a row without
// one of the required values, does not stop the reading: the row (or, for Bob and the
// viscosities, that value) is left out and listed in Survey.Excluded with its line and reason.

// MaxSurveySize is the largest survey file the reader accepts, in bytes (64 MiB, some 600,000
// samples).
const MaxSurveySize = 64 << 20

// The canonical column names of a survey file; SurveyExclusion.Columns uses them.
const (
	SurveyColSample         = "sample"
	SurveyColTemperature    = "temperature"
	SurveyColAPI            = "API"
	SurveyColGasGravity     = "gas gravity"
	SurveyColRsb            = "Rsb"
	SurveyColPb             = "Pb"
	SurveyColBob            = "Bob"
	SurveyColDeadViscosity  = "dead oil viscosity"
	SurveyColSatViscosity   = "oil viscosity at Pb"
	SurveyColSepPressure    = "separator pressure"
	SurveyColSepTemperature = "separator temperature"
)

// surveyMaxPb bounds a survey bubble point, psia: no black or volatile oil's bubble point comes
// near it (the Valkó–McCain (2003) data set behind the catalog's ranges reaches 6,700 psia), so
// a larger value is a slip.
const surveyMaxPb = 20000

var surveyCols = []colSpec{
	{name: SurveyColSample, synonyms: []string{"sample id", "sample name", "id"}, text: true},
	{name: SurveyColTemperature, synonyms: []string{"reservoir temperature", "T", "Tres", "TR"}, q: Temperature, required: true, lo: 32, hi: 500},
	// API: from bitumen-like heavy oils (8–10 °API) to the lightest volatile oils.
	{name: SurveyColAPI, synonyms: []string{"stock-tank API", "API gravity", "oil gravity", "stock tank oil gravity"}, q: APIGravity, required: true, lo: 5, loOpen: true, hi: 90},
	// Gas gravity: methane, the lightest natural-gas component, is 0.554 (common practice).
	{name: SurveyColGasGravity, synonyms: []string{"separator gas gravity", "gas specific gravity", "gamma g", "γg"}, q: Dimensionless, required: true, lo: 0.55, hi: 3},
	{name: SurveyColRsb, synonyms: []string{"Rs at Pb", "solution GOR at Pb", "bubble point GOR", "solution GOR", "GOR", "Rsfb"}, q: GOR, required: true, loOpen: true, hi: 10000},
	// Pb above one atmosphere: an oil holding gas at reservoir temperature boils above it.
	{name: SurveyColPb, synonyms: []string{"bubble point", "bubble point pressure", "bubblepoint pressure", "saturation pressure", "Psat"}, q: Pressure, required: true, lo: atmPsi, loOpen: true, hi: surveyMaxPb},
	// Bob above 1: a live oil at reservoir temperature is larger than its stock-tank volume.
	{name: SurveyColBob, synonyms: []string{"Bo at Pb", "Bofb", "oil FVF at Pb", "Bo"}, q: FVF, lo: 1, loOpen: true, hi: 5},
	{name: SurveyColDeadViscosity, synonyms: []string{"mu_dead", "μod", "muod", "dead viscosity", "dead-oil viscosity"}, q: Viscosity, loOpen: true, hi: 1e6},
	{name: SurveyColSatViscosity, synonyms: []string{"mu_sat", "μob", "muob", "mu_ob", "saturated oil viscosity", "viscosity at Pb", "oil viscosity at bubble point"}, q: Viscosity, loOpen: true, hi: 1e6},
	{name: SurveyColSepPressure, synonyms: []string{"psep", "first stage separator pressure", "first-stage separator pressure"}, q: Pressure, loOpen: true, hi: surveyMaxPb},
	{name: SurveyColSepTemperature, synonyms: []string{"Tsep", "first stage separator temperature", "first-stage separator temperature"}, q: Temperature, lo: -60, hi: 500},
	{name: "well", synonyms: []string{"well name"}, text: true},
	{name: "reservoir", synonyms: []string{"formation", "zone"}, text: true},
	{name: "note", synonyms: []string{"comment", "remarks"}, text: true},
}

// Survey is a regional PVT database read from a survey file. Values are in field units.
type Survey struct {
	File        string            // the file name as given
	Rows        int               // data rows read
	Samples     []SurveySample    // the usable rows, in file order
	Excluded    []SurveyExclusion // rows and values left out, in file order
	Fingerprint string            // hex SHA-256 of the file's bytes
}

// SurveySample is one row of a survey file. Optional values are 0 when absent or left out.
type SurveySample struct {
	Line           int     // line in the file
	ID             string  // the sample column, or "line N" when the file has none or the cell is empty
	Temperature    float64 // reservoir temperature, °F
	API            float64 // stock-tank oil gravity, °API
	GasGravity     float64 // separator gas gravity, air = 1
	Rsb            float64 // solution GOR at Pb, scf/STB
	Pb             float64 // bubble-point pressure, psia
	Bob            float64 // oil FVF at Pb, rb/STB
	DeadViscosity  float64 // dead-oil viscosity at reservoir temperature, cP
	SatViscosity   float64 // oil viscosity at Pb, cP
	SepPressure    float64 // first-stage separator pressure, psia
	SepTemperature float64 // first-stage separator temperature, °F
}

// SurveyExclusion is a row, or one value of a row, that the reader left out.
type SurveyExclusion struct {
	Line   int    // line in the file
	Sample string // the row's sample id, as SurveySample.ID
	// Columns lists the canonical names of the values left out (SurveyColBob, …); nil means the
	// whole row.
	Columns []string
	Reason  string
}

// ReadSurvey reads the survey file at path (see the format above). A file larger than
// MaxSurveySize is refused before it is read.
func ReadSurvey(path string) (*Survey, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, &ParseError{File: path, Err: ErrMissingFile, Msg: "cannot open the survey file: " + unwrapPath(err)}
	}
	defer f.Close()
	fi, err := f.Stat()
	if err != nil {
		return nil, &ParseError{File: path, Err: ErrMissingFile, Msg: "cannot read: " + unwrapPath(err)}
	}
	if fi.IsDir() {
		return nil, &ParseError{File: path, Err: ErrMissingFile, Msg: "is a folder; a survey is a single CSV file",
			Hint: "a report folder is read by check, rank and tune"}
	}
	if fi.Size() > MaxSurveySize {
		return nil, surveyTooLarge(path, fi.Size())
	}
	data, err := io.ReadAll(io.LimitReader(f, MaxSurveySize+1))
	if err != nil {
		return nil, &ParseError{File: path, Err: ErrMissingFile, Msg: "cannot read: " + unwrapPath(err)}
	}
	if len(data) > MaxSurveySize {
		return nil, surveyTooLarge(path, int64(len(data)))
	}
	return ParseSurvey(path, data)
}

func surveyTooLarge(name string, size int64) error {
	return &ParseError{File: name, Err: ErrTooLarge,
		Msg: fmt.Sprintf("file is %s (%d bytes), larger than the limit of %s", mib(size), size, mib(MaxSurveySize))}
}

// ParseSurvey reads a survey file's contents; file names it in errors and in Survey.File.
func ParseSurvey(file string, data []byte) (*Survey, error) {
	recs, err := splitRecords(file, data)
	if err != nil {
		return nil, err
	}
	t, err := parseTable(file, recs, surveyCols)
	if err != nil {
		return nil, err
	}
	sum := sha256.Sum256(data)
	sv := &Survey{File: file, Rows: len(t.rows), Samples: make([]SurveySample, 0, len(t.rows)), Fingerprint: hex.EncodeToString(sum[:])}
	seen := make(map[[10]float64]int, len(t.rows))
	for _, r := range t.rows {
		s, ex, err := t.surveyRow(r)
		if err != nil {
			return nil, err
		}
		if ex != nil {
			sv.Excluded = append(sv.Excluded, *ex)
			if ex.Columns == nil {
				continue
			}
		}
		key := [10]float64{s.Temperature, s.API, s.GasGravity, s.Rsb, s.Pb, s.Bob, s.DeadViscosity, s.SatViscosity, s.SepPressure, s.SepTemperature}
		if prev, dup := seen[key]; dup {
			sv.Excluded = append(sv.Excluded, SurveyExclusion{Line: r.line, Sample: s.ID,
				Reason: fmt.Sprintf("the same values as line %d: a duplicate would count one oil twice", prev)})
			continue
		}
		seen[key] = r.line
		sv.Samples = append(sv.Samples, s)
	}
	return sv, nil
}

// surveyRow reads one row. A structural problem is an error; a value out of bounds or a missing
// required value gives an exclusion (Columns nil: the whole row).
func (t *table) surveyRow(r record) (SurveySample, *SurveyExclusion, error) {
	s := SurveySample{Line: r.line, ID: t.text(r, SurveyColSample)}
	if s.ID == "" {
		s.ID = "line " + strconv.Itoa(r.line)
	}
	rowOut := func(reason string) (SurveySample, *SurveyExclusion, error) {
		return s, &SurveyExclusion{Line: r.line, Sample: s.ID, Reason: reason}, nil
	}
	for _, f := range []struct {
		col string
		dst *float64
	}{
		{SurveyColTemperature, &s.Temperature}, {SurveyColAPI, &s.API}, {SurveyColGasGravity, &s.GasGravity},
		{SurveyColRsb, &s.Rsb}, {SurveyColPb, &s.Pb}, {SurveyColSepPressure, &s.SepPressure}, {SurveyColSepTemperature, &s.SepTemperature},
	} {
		c := t.cols[f.col]
		if c == nil {
			continue
		}
		if c.spec.required && r.cells[c.index] == "" {
			return rowOut(fmt.Sprintf("no %s value (column %d)", f.col, c.index+1))
		}
		v, err := t.num(r, f.col)
		if reason, ok := boundsReason(err); ok {
			return rowOut(reason)
		} else if err != nil {
			return s, nil, missingHint(err, r.cells[c.index])
		}
		*f.dst = v
	}
	if s.SepPressure != 0 && s.SepPressure >= s.Pb {
		return rowOut(fmt.Sprintf("separator pressure %s psia is not below Pb %s psia", fmtNum(roundTo(s.SepPressure, 3)), fmtNum(roundTo(s.Pb, 3))))
	}
	var ex *SurveyExclusion
	drop := func(cols []string, reason string) {
		if ex == nil {
			ex = &SurveyExclusion{Line: r.line, Sample: s.ID, Reason: reason}
		} else {
			ex.Reason += "; " + reason
		}
		ex.Columns = append(ex.Columns, cols...)
	}
	for _, f := range []struct {
		col string
		dst *float64
	}{{SurveyColBob, &s.Bob}, {SurveyColDeadViscosity, &s.DeadViscosity}, {SurveyColSatViscosity, &s.SatViscosity}} {
		v, err := t.num(r, f.col)
		if reason, ok := boundsReason(err); ok {
			drop([]string{f.col}, reason+"; the value is left out")
			continue
		} else if err != nil {
			return s, nil, missingHint(err, r.cells[t.cols[f.col].index])
		}
		*f.dst = v
	}
	if s.DeadViscosity > 0 && s.SatViscosity > s.DeadViscosity {
		drop([]string{SurveyColDeadViscosity, SurveyColSatViscosity}, fmt.Sprintf(
			"oil viscosity at Pb %s cP is above the dead-oil viscosity %s cP, but gas in solution thins an oil: one of them is wrong, both are left out",
			fmtNum(roundTo(s.SatViscosity, 4)), fmtNum(roundTo(s.DeadViscosity, 4))))
		s.DeadViscosity, s.SatViscosity = 0, 0
	}
	return s, ex, nil
}

// missingHint adds a hint to the error of a cell that marks a value as not measured, such as
// "n/a" or "-": a database leaves such a cell empty.
func missingHint(err error, cell string) error {
	var pe *ParseError
	if errors.As(err, &pe) && errors.Is(err, ErrNumber) && pe.Hint == "" {
		switch strings.ToLower(strings.Trim(cell, " #")) {
		case "n/a", "na", "-", "--", "nan", "none", "null", "nm", "n.m.", "?":
			pe.Hint = "leave the cell empty when a value was not measured"
		}
	}
	return err
}

// boundsReason turns a range error of a cell into the reason a row is left out.
func boundsReason(err error) (string, bool) {
	var pe *ParseError
	if err == nil || !errors.Is(err, ErrRange) || !errors.As(err, &pe) {
		return "", false
	}
	reason := fmt.Sprintf("%s (column %d): %s", pe.Header, pe.Column, pe.Msg)
	if pe.Hint != "" {
		reason += "; hint: " + pe.Hint
	}
	return reason, true
}

// SurveyBounds returns the accepted range of a survey column in field units, for messages and
// tests; ok is false for a text column or an unknown name.
func SurveyBounds(column string) (lo, hi float64, loOpen, ok bool) {
	for _, c := range surveyCols {
		if c.name == column && !c.text {
			return c.lo, c.hi, c.loOpen, true
		}
	}
	return 0, 0, false, false
}

package lab

import (
	"crypto/sha256"
	"encoding/hex"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"math"
	"os"
	"path"
	"sort"
	"strconv"
	"strings"
)

// MaxFileSize is the largest file the reader accepts, in bytes (10 MiB). A lab report's
// tables are a few kilobytes; anything near this size is not one.
const MaxFileSize = 10 << 20

// The files of a report folder (DESIGN.md §3). Only FluidFile and DLFile are required.
const (
	FluidFile     = "fluid.csv"
	DLFile        = "dl.csv"
	SeparatorFile = "separator.csv"
	CCEFile       = "cce.csv"
	ViscosityFile = "viscosity.csv"
)

// The canonical keys of fluid.csv; Fluid.Line is indexed by them.
const (
	KeySample         = "sample"
	KeyTemperature    = "reservoir temperature"
	KeyPb             = "saturation pressure"
	KeyAPI            = "stock-tank API"
	KeyResidualSG     = "residual oil gravity"
	KeyResidualAPI    = "residual oil API"
	KeySepGasGravity  = "separator gas gravity"
	KeyH2S            = "H2S"
	KeyCO2            = "CO2"
	KeyN2             = "N2"
	KeyStdPressure    = "standard pressure"
	KeyStdTemperature = "standard temperature"
	KeySelectedTest   = "selected separator test"
)

// Defaults of the standard conditions (common practice; some labs report at 14.65 psia).
const (
	DefaultStdPressure    = 14.696 // psia
	DefaultStdTemperature = 60.0   // °F
)

// maxPressure bounds every pressure, psia: no reservoir or lab cell approaches it, so a
// larger value is a unit slip (kPa written as psia).
const maxPressure = 50000

var fluidKeys = []colSpec{
	{name: KeySample, synonyms: []string{"sample id", "sample name"}, text: true},
	{name: KeyTemperature, synonyms: []string{"temperature", "reservoir temp", "Tres", "TR"}, q: Temperature, required: true, lo: 32, hi: 500},
	{name: KeyPb, synonyms: []string{"bubble point", "bubble point pressure", "bubblepoint pressure", "Pb", "Psat", "saturation"}, q: Pressure, required: true, loOpen: true, hi: maxPressure},
	{name: KeyAPI, synonyms: []string{"API", "stock tank API", "API gravity", "oil gravity", "stock tank oil gravity"}, q: APIGravity, loOpen: true, hi: 100},
	{name: KeyResidualSG, synonyms: []string{"residual oil specific gravity", "residual oil SG"}, q: Dimensionless, lo: 0.5, hi: 1.07},
	{name: KeyResidualAPI, synonyms: []string{"residual oil API gravity", "API of residual oil"}, q: APIGravity, loOpen: true, hi: 100},
	{name: KeySepGasGravity, synonyms: []string{"gas gravity", "separator gas specific gravity", "gas specific gravity"}, q: Dimensionless, lo: 0.5, hi: 5},
	{name: KeyH2S, synonyms: []string{"hydrogen sulfide", "hydrogen sulphide"}, q: MolePercent, hi: 100},
	{name: KeyCO2, synonyms: []string{"carbon dioxide"}, q: MolePercent, hi: 100},
	{name: KeyN2, synonyms: []string{"nitrogen"}, q: MolePercent, hi: 100},
	{name: KeyStdPressure, synonyms: []string{"standard conditions pressure", "Psc"}, q: Pressure, lo: 10, hi: 20},
	{name: KeyStdTemperature, synonyms: []string{"standard conditions temperature", "Tsc"}, q: Temperature, lo: 32, hi: 80},
	{name: KeySelectedTest, synonyms: []string{"selected test", "separator test"}, text: true},
}

var dlCols = []colSpec{
	{name: "pressure", synonyms: []string{"p"}, q: Pressure, required: true, loOpen: true, hi: maxPressure},
	{name: "Rsd", synonyms: []string{"solution GOR", "Rs", "solution gas", "solution gas oil ratio"}, q: GOR, required: true, hi: 1e6},
	{name: "Bod", synonyms: []string{"relative oil volume", "Bo", "oil relative volume"}, q: FVF, required: true, loOpen: true, hi: 20},
	{name: "Bt", synonyms: []string{"Btd", "relative total volume", "total relative volume"}, q: FVF, loOpen: true, hi: 1e5},
	{name: "oil density", synonyms: []string{"density"}, q: Density, loOpen: true, hi: 150},
	{name: "Z", synonyms: []string{"Z factor", "gas Z", "deviation factor", "gas deviation factor"}, q: Dimensionless, loOpen: true, hi: 5},
	{name: "Bg", synonyms: []string{"gas FVF", "gas formation volume factor"}, q: GasFVF, loOpen: true, hi: 1e3},
	{name: "gas gravity", synonyms: []string{"gas specific gravity", "incremental gas gravity", "liberated gas gravity"}, q: Dimensionless, lo: 0.5, hi: 5},
	{name: "temperature", synonyms: []string{"T"}, q: Temperature, lo: 32, hi: 500},
	{name: "stage", synonyms: []string{"step", "label"}, text: true},
}

var separatorCols = []colSpec{
	{name: "test", synonyms: []string{"test id", "separator test"}, text: true, required: true},
	{name: "stage", synonyms: []string{"separator stage"}, text: true, required: true},
	{name: "pressure", synonyms: []string{"p"}, q: Pressure, required: true, loOpen: true, hi: maxPressure},
	{name: "temperature", synonyms: []string{"T"}, q: Temperature, required: true, lo: -60, hi: 500},
	{name: "GOR", synonyms: []string{"gas oil ratio", "stage GOR", "separator GOR"}, q: GOR, required: true, hi: 1e6},
	{name: "gas gravity", synonyms: []string{"gas specific gravity"}, q: Dimensionless, lo: 0.5, hi: 5},
	{name: "Bofb", synonyms: []string{"Bo", "oil FVF", "formation volume factor"}, q: FVF, loOpen: true, hi: 20},
	{name: "API", synonyms: []string{"stock-tank API", "API gravity"}, q: APIGravity, loOpen: true, hi: 100},
}

var cceCols = []colSpec{
	{name: "pressure", synonyms: []string{"p"}, q: Pressure, required: true, loOpen: true, hi: maxPressure},
	{name: "relative volume", synonyms: []string{"V/Vsat", "Vrel", "rel volume"}, q: Dimensionless, required: true, loOpen: true, hi: 100},
	{name: "density", synonyms: []string{"oil density"}, q: Density, loOpen: true, hi: 150},
	{name: "Y", synonyms: []string{"Y function"}, q: Dimensionless, loOpen: true, hi: 1000},
}

var viscosityCols = []colSpec{
	{name: "pressure", synonyms: []string{"p"}, q: Pressure, required: true, loOpen: true, hi: maxPressure},
	{name: "oil viscosity", synonyms: []string{"viscosity", "muo", "mu o", "μo"}, q: Viscosity, required: true, loOpen: true, hi: 1e6},
	{name: "gas viscosity", synonyms: []string{"mug", "mu g", "μg"}, q: Viscosity, loOpen: true, hi: 10},
}

// ReadFolder reads the report folder dir; see ReadFS. Report.Dir is set to dir.
func ReadFolder(dir string) (*Report, error) {
	fi, err := os.Stat(dir)
	if err != nil {
		return nil, &ParseError{File: dir, Err: ErrMissingFile, Msg: "report folder not found"}
	}
	if !fi.IsDir() {
		return nil, &ParseError{File: dir, Err: ErrMissingFile, Msg: "not a folder; a report is a folder of CSV files",
			Hint: "give the folder that holds fluid.csv and dl.csv"}
	}
	r, err := ReadFS(os.DirFS(dir), ".")
	if err != nil {
		return nil, err
	}
	r.Dir = dir
	return r, nil
}

// ReadFS reads the report folder dir of fsys (DESIGN.md §3): fluid.csv and dl.csv, and
// separator.csv, cce.csv and viscosity.csv when present. File names match
// case-insensitively. Every value is converted to field units. The report is checked for
// structure (numbers, units, ranges, order, cross-file slips such as psig for psia); any
// problem gives a *ParseError and no report. A file larger than MaxFileSize is refused
// before it is read.
func ReadFS(fsys fs.FS, dir string) (*Report, error) {
	fr := &folderReader{fsys: fsys, dir: dir, data: map[string][]byte{}}
	if err := fr.list(); err != nil {
		return nil, err
	}
	rep := &Report{}
	var err error
	if rep.Fluid, err = fr.readFluid(); err != nil {
		return nil, err
	}
	if rep.DL, err = fr.readDL(rep.Fluid); err != nil {
		return nil, err
	}
	if rep.Separator, err = fr.readSeparator(); err != nil {
		return nil, err
	}
	if rep.CCE, err = fr.readCCE(); err != nil {
		return nil, err
	}
	if rep.Viscosity, err = fr.readViscosity(); err != nil {
		return nil, err
	}
	if err := fr.crossCheck(rep); err != nil {
		return nil, err
	}
	rep.Fingerprint = fr.fingerprint()
	return rep, nil
}

type folderReader struct {
	fsys  fs.FS
	dir   string
	names map[string]string // lower-case name → name in the folder
	csvs  []string          // every .csv file found, for hints
	data  map[string][]byte // files read, by name in the folder
	keys  map[string]string // fluid.csv canonical key → key as written

	pbUnit, dlUnit, cceUnit unitDef // units as written, for the psig/psia hint
}

func (fr *folderReader) list() error {
	entries, err := fs.ReadDir(fr.fsys, fr.dir)
	if err != nil {
		return &ParseError{File: fr.dir, Err: ErrMissingFile, Msg: "cannot list the report folder: " + unwrapPath(err)}
	}
	fr.names = map[string]string{}
	for _, e := range entries {
		if e.IsDir() {
			continue
		}
		lower := strings.ToLower(e.Name())
		if strings.HasSuffix(lower, ".csv") {
			fr.csvs = append(fr.csvs, e.Name())
		}
		// An exact lower-case name wins over a case variant.
		if prev, ok := fr.names[lower]; !ok || prev != lower {
			fr.names[lower] = e.Name()
		}
	}
	if len(fr.csvs) == 0 {
		return &ParseError{Err: ErrMissingFile, Msg: "the report folder holds no CSV files; expected fluid.csv and dl.csv",
			Hint: "labmatch samples --out DIR writes example report folders"}
	}
	for _, req := range []string{FluidFile, DLFile} {
		if _, ok := fr.names[req]; !ok {
			return &ParseError{File: req, Err: ErrMissingFile, Msg: "required file not found in the report folder",
				Hint: "found " + strings.Join(fr.csvs, ", ") + "; a report needs fluid.csv and dl.csv"}
		}
	}
	return nil
}

func unwrapPath(err error) string {
	var pe *fs.PathError
	if errors.As(err, &pe) {
		return pe.Err.Error()
	}
	return err.Error()
}

// readFile returns the contents of file, or nil when the optional file is absent. The size
// is checked with Stat before a byte is read, and the read is bounded in case the file
// grows meanwhile.
func (fr *folderReader) readFile(file string) ([]byte, string, error) {
	name, ok := fr.names[file]
	if !ok {
		return nil, "", nil
	}
	p := path.Join(fr.dir, name)
	fi, err := fs.Stat(fr.fsys, p)
	if err != nil {
		return nil, name, &ParseError{File: name, Err: ErrMissingFile, Msg: "cannot read: " + unwrapPath(err)}
	}
	if fi.Size() > MaxFileSize {
		return nil, name, tooLarge(name, fi.Size())
	}
	f, err := fr.fsys.Open(p)
	if err != nil {
		return nil, name, &ParseError{File: name, Err: ErrMissingFile, Msg: "cannot open: " + unwrapPath(err)}
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, MaxFileSize+1))
	if err != nil {
		return nil, name, &ParseError{File: name, Err: ErrMissingFile, Msg: "cannot read: " + unwrapPath(err)}
	}
	if len(data) > MaxFileSize {
		return nil, name, tooLarge(name, int64(len(data)))
	}
	fr.data[name] = data
	return data, name, nil
}

func tooLarge(name string, size int64) error {
	return &ParseError{File: name, Err: ErrTooLarge,
		Msg:  fmt.Sprintf("file is %s (%d bytes), larger than the limit of %s", mib(size), size, mib(MaxFileSize)),
		Hint: "a report table is a few kilobytes: is this the right file?"}
}

func mib(n int64) string { return strconv.FormatFloat(float64(n)/(1<<20), 'f', 1, 64) + " MiB" }

// fingerprint is the hex SHA-256 over the sorted names and contents of the files read,
// each name and content preceded by its length so that no two folders collide by framing.
func (fr *folderReader) fingerprint() string {
	names := make([]string, 0, len(fr.data))
	for n := range fr.data {
		names = append(names, n)
	}
	sort.Strings(names)
	h := sha256.New()
	for _, n := range names {
		fmt.Fprintf(h, "%d:%s%d:", len(n), n, len(fr.data[n]))
		h.Write(fr.data[n])
	}
	return hex.EncodeToString(h.Sum(nil))
}

func (fr *folderReader) readFluid() (Fluid, error) {
	data, file, err := fr.readFile(FluidFile)
	if err != nil {
		return Fluid{}, err
	}
	recs, err := splitRecords(file, data)
	if err != nil {
		return Fluid{}, err
	}
	if len(recs) > 0 && normName(recs[0].cells[0]) == "key" {
		recs = recs[1:]
	}
	if len(recs) == 0 {
		return Fluid{}, &ParseError{File: file, Err: ErrEmpty, Msg: "no key,value,unit rows",
			Hint: "rows such as: reservoir temperature,220,degF"}
	}
	fl := Fluid{Line: map[string]int{}}
	fr.keys = map[string]string{}
	var residualSG float64
	for _, rec := range recs {
		if len(trimTrailing(rec.cells)) > 3 {
			return Fluid{}, &ParseError{File: file, Line: rec.line, Err: ErrRagged,
				Msg:  fmt.Sprintf("expected 3 cells (key, value, unit), got %d", len(rec.cells)),
				Hint: "a decimal comma splits a number in two: use a point (12.5)"}
		}
		cells := append(trimTrailing(rec.cells), "", "", "")[:3]
		key, value, unit := cells[0], cells[1], cells[2]
		var spec *colSpec
		n := normName(key)
		for k := range fluidKeys {
			if fluidKeys[k].matches(n) {
				spec = &fluidKeys[k]
				break
			}
		}
		pe := &ParseError{File: file, Line: rec.line, Column: 1, Header: key}
		if spec == nil {
			pe.Err, pe.Msg = ErrUnknownColumn, fmt.Sprintf("unknown key %q (accepted: %s)", key, specNames(fluidKeys))
			if key == "" {
				pe.Msg = "empty key (accepted: " + specNames(fluidKeys) + ")"
			}
			return Fluid{}, pe
		}
		if prev, dup := fl.Line[spec.name]; dup {
			pe.Err, pe.Msg = ErrDuplicateKey, fmt.Sprintf("%s is given twice, on lines %d and %d", spec.name, prev, rec.line)
			return Fluid{}, pe
		}
		fl.Line[spec.name] = rec.line
		fr.keys[spec.name] = key
		if spec.text {
			if unit != "" {
				pe.Column, pe.Err, pe.Msg = 3, ErrUnknownUnit, fmt.Sprintf("%s is text and takes no unit", spec.name)
				return Fluid{}, pe
			}
			switch spec.name {
			case KeySample:
				fl.Sample = value
			case KeySelectedTest:
				fl.SelectedTest = value
			}
			continue
		}
		u, ok := lookupUnit(spec.q, unit)
		if !ok {
			ue := unitError(spec.q, unit)
			pe.Column, pe.Err, pe.Msg, pe.Hint = 3, ue.Err, ue.Msg, ue.Hint
			if ue.Err == ErrMissingUnit {
				pe.Msg = fmt.Sprintf("%s needs a unit in the third cell (accepted: %s)", spec.name, acceptedUnits(spec.q))
				pe.Hint = fmt.Sprintf("write it as: %s,%s,%s", key, value, spec.q.FieldUnit())
			}
			return Fluid{}, pe
		}
		s := *spec
		s.required = true // an explicit 0 is checked, not read as "not reported"
		v, err := convertCell(file, rec.line, 2, key, value, s, u)
		if err != nil {
			return Fluid{}, err
		}
		if spec.name == KeyPb {
			fr.pbUnit = u
		}
		switch spec.name {
		case KeyTemperature:
			fl.Temperature = v
		case KeyPb:
			fl.Pb = v
		case KeyAPI:
			fl.API = v
		case KeyResidualSG:
			residualSG = v
			fl.ResidualAPI, _ = SGToAPI(v)
		case KeyResidualAPI:
			fl.ResidualAPI = v
		case KeySepGasGravity:
			fl.SepGasGravity = v
		case KeyH2S:
			fl.H2S = v
		case KeyCO2:
			fl.CO2 = v
		case KeyN2:
			fl.N2 = v
		case KeyStdPressure:
			fl.StdPressure = v
		case KeyStdTemperature:
			fl.StdTemperature = v
		}
	}
	for _, k := range []string{KeyTemperature, KeyPb} {
		if _, ok := fl.Line[k]; !ok {
			return Fluid{}, &ParseError{File: file, Err: ErrMissingColumn, Msg: fmt.Sprintf("no %s row (required)", k),
				Hint: fmt.Sprintf("add a row such as: %s", map[string]string{KeyTemperature: "reservoir temperature,220,degF", KeyPb: "saturation pressure,2500,psia"}[k])}
		}
	}
	if _, ok := fl.Line[KeyAPI]; !ok {
		if _, ok := fl.Line[KeyResidualSG]; !ok {
			return Fluid{}, &ParseError{File: file, Err: ErrMissingColumn, Msg: "no stock-tank API row (or residual oil gravity, as specific gravity)",
				Hint: "add a row such as: stock-tank API,35,API"}
		}
		fl.API, _ = SGToAPI(residualSG) // residualSG is in (0.5, 1.07]: finite and positive
	}
	if sum := fl.H2S + fl.CO2 + fl.N2; sum > 100 {
		return Fluid{}, &ParseError{File: file, Err: ErrRange, Msg: fmt.Sprintf("H2S + CO2 + N2 = %s mol%%, more than 100", fmtNum(sum))}
	}
	if fl.StdPressure == 0 {
		fl.StdPressure = DefaultStdPressure
	}
	if fl.StdTemperature == 0 {
		fl.StdTemperature = DefaultStdTemperature
	}
	return fl, nil
}

func (fr *folderReader) readTable(file string, specs []colSpec) (*table, error) {
	data, name, err := fr.readFile(file)
	if err != nil || data == nil && name == "" {
		return nil, err
	}
	recs, err := splitRecords(name, data)
	if err != nil {
		return nil, err
	}
	return parseTable(name, recs, specs)
}

func (fr *folderReader) readDL(fl Fluid) ([]DLStage, error) {
	t, err := fr.readTable(DLFile, dlCols)
	if err != nil {
		return nil, err
	}
	fr.dlUnit = t.cols["pressure"].unit
	out := make([]DLStage, 0, len(t.rows))
	for i, r := range t.rows {
		var s DLStage
		s.Line = r.line
		var temp float64
		for _, f := range []struct {
			col string
			dst *float64
		}{
			{"pressure", &s.Pressure}, {"Rsd", &s.Rsd}, {"Bod", &s.Bod}, {"Bt", &s.Bt},
			{"oil density", &s.OilDensity}, {"Z", &s.Z}, {"Bg", &s.Bg},
			{"gas gravity", &s.GasGravity}, {"temperature", &temp},
		} {
			if *f.dst, err = t.num(r, f.col); err != nil {
				return nil, err
			}
		}
		if isResidual60(t.text(r, "stage")) ||
			temp != 0 && math.Abs(temp-fl.StdTemperature) <= 1 && math.Abs(temp-fl.Temperature) > 1 {
			s.Residual60 = true
		}
		if s.Residual60 && i != len(t.rows)-1 {
			return nil, &ParseError{File: t.file, Line: r.line, Err: ErrOrder,
				Msg: "the residual-oil row at 60 °F must be the last row of dl.csv"}
		}
		if n := len(out); n > 0 && !s.Residual60 && s.Pressure >= out[n-1].Pressure {
			c := t.cols["pressure"]
			return nil, &ParseError{File: t.file, Line: r.line, Column: c.index + 1, Header: c.header, Err: ErrOrder,
				Msg: fmt.Sprintf("%s is not below the previous stage's %s (line %d); DL stages go from the highest pressure down",
					r.cells[c.index], t.rows[i-1].cells[c.index], out[n-1].Line)}
		}
		out = append(out, s)
	}
	return out, nil
}

// isResidual60 recognises the stage label of the residual oil at 60 °F, such as
// "residual oil at 60F" or "Residual oil @ 60 °F".
func isResidual60(label string) bool {
	n := strings.NewReplacer(" ", "", "°", "", "deg", "").Replace(strings.ToLower(label))
	return strings.Contains(n, "residual") && strings.Contains(n, "60f")
}

// stockTankStage is the canonical label of a test's last stage.
const stockTankStage = "stock tank"

func isStockTank(label string) bool {
	switch strings.ReplaceAll(normName(label), " ", "") {
	case "stocktank", "st", "tank", "stocktankoil", "sto":
		return true
	}
	return false
}

func (fr *folderReader) readSeparator() ([]SeparatorTest, error) {
	t, err := fr.readTable(SeparatorFile, separatorCols)
	if t == nil || err != nil {
		return nil, err
	}
	var tests []SeparatorTest
	index := map[string]int{}
	type seen struct{ bofbLine, apiLine int }
	extra := map[string]*seen{}
	stageLine := map[[2]string]int{}
	for _, r := range t.rows {
		id, label := t.text(r, "test"), t.text(r, "stage")
		for _, c := range []string{"test", "stage"} {
			if t.text(r, c) == "" {
				col := t.cols[c]
				return nil, &ParseError{File: t.file, Line: r.line, Column: col.index + 1, Header: col.header, Err: ErrEmpty,
					Msg: "empty cell; every row names its " + c}
			}
		}
		if isStockTank(label) {
			label = stockTankStage
		}
		st := SeparatorStage{Line: r.line, Stage: label}
		for _, f := range []struct {
			col string
			dst *float64
		}{{"pressure", &st.Pressure}, {"temperature", &st.Temperature}, {"GOR", &st.GOR}, {"gas gravity", &st.GasGravity}} {
			if *f.dst, err = t.num(r, f.col); err != nil {
				return nil, err
			}
		}
		bofb, err := t.num(r, "Bofb")
		if err != nil {
			return nil, err
		}
		api, err := t.num(r, "API")
		if err != nil {
			return nil, err
		}
		k, ok := index[id]
		if !ok {
			k = len(tests)
			index[id] = k
			tests = append(tests, SeparatorTest{ID: id})
			extra[id] = &seen{}
		}
		test := &tests[k]
		if prev, dup := stageLine[[2]string{id, label}]; dup {
			col := t.cols["stage"]
			return nil, &ParseError{File: t.file, Line: r.line, Column: col.index + 1, Header: col.header, Err: ErrDuplicateKey,
				Msg: fmt.Sprintf("stage %q of test %q is given twice, on lines %d and %d", label, id, prev, r.line)}
		}
		stageLine[[2]string{id, label}] = r.line
		if n := len(test.Stages); n > 0 {
			last := test.Stages[n-1]
			col := t.cols["stage"]
			if last.Stage == stockTankStage {
				return nil, &ParseError{File: t.file, Line: r.line, Column: col.index + 1, Header: col.header, Err: ErrOrder,
					Msg: fmt.Sprintf("test %q continues after its stock-tank stage (line %d); the stock tank is the last stage", id, last.Line)}
			}
			if st.Pressure >= last.Pressure {
				pc := t.cols["pressure"]
				return nil, &ParseError{File: t.file, Line: r.line, Column: pc.index + 1, Header: pc.header, Err: ErrOrder,
					Msg: fmt.Sprintf("stage pressure %s is not below the previous stage's (line %d) in test %q; separator stages go down in pressure",
						r.cells[pc.index], last.Line, id)}
			}
		}
		test.Stages = append(test.Stages, st)
		for _, f := range []struct {
			col  string
			v    float64
			dst  *float64
			line *int
		}{{"Bofb", bofb, &test.Bofb, &extra[id].bofbLine}, {"API", api, &test.API, &extra[id].apiLine}} {
			if f.v == 0 {
				continue
			}
			if *f.line != 0 && *f.dst != f.v {
				col := t.cols[f.col]
				return nil, &ParseError{File: t.file, Line: r.line, Column: col.index + 1, Header: col.header, Err: ErrDuplicateKey,
					Msg:  fmt.Sprintf("%s of test %q is given twice with different values, on lines %d and %d", f.col, id, *f.line, r.line),
					Hint: "give it once, on the stock-tank row"}
			}
			*f.dst, *f.line = f.v, r.line
		}
	}
	return tests, nil
}

func (fr *folderReader) readCCE() ([]CCEPoint, error) {
	t, err := fr.readTable(CCEFile, cceCols)
	if t == nil || err != nil {
		return nil, err
	}
	fr.cceUnit = t.cols["pressure"].unit
	out := make([]CCEPoint, 0, len(t.rows))
	for _, r := range t.rows {
		p := CCEPoint{Line: r.line}
		for _, f := range []struct {
			col string
			dst *float64
		}{{"pressure", &p.Pressure}, {"relative volume", &p.RelVolume}, {"density", &p.Density}, {"Y", &p.Y}} {
			if *f.dst, err = t.num(r, f.col); err != nil {
				return nil, err
			}
		}
		out = append(out, p)
	}
	return out, nil
}

func (fr *folderReader) readViscosity() ([]ViscosityPoint, error) {
	t, err := fr.readTable(ViscosityFile, viscosityCols)
	if t == nil || err != nil {
		return nil, err
	}
	out := make([]ViscosityPoint, 0, len(t.rows))
	for _, r := range t.rows {
		p := ViscosityPoint{Line: r.line}
		for _, f := range []struct {
			col string
			dst *float64
		}{{"pressure", &p.Pressure}, {"oil viscosity", &p.Oil}, {"gas viscosity", &p.Gas}} {
			if *f.dst, err = t.num(r, f.col); err != nil {
				return nil, err
			}
		}
		out = append(out, p)
	}
	return out, nil
}

// gaugeSlip reports an ErrMismatch when the saturation pressure and the pressure p of
// another file (the first DL stage, the CCE point at V/Vsat = 1) differ by one atmosphere:
// one of them was almost surely a gauge value written as absolute or the reverse. The
// hint names the candidates that the units as written allow; pbConfirmed drops the
// saturation pressure when a third table agrees with it.
//
// When the two are written in the same kind of unit (both absolute, say) a gap near one
// atmosphere may also be an ordinary spread between tables, so the gap must then match
// 14.696 psi to gaugeSlipSameTol (a value copied from a gauge column); wider gaps are left to
// the QC finding pb-psig-psia.
func (fr *folderReader) gaugeSlip(fl Fluid, other string, otherUnit unitDef, p float64, line int, pbConfirmed bool) error {
	d := fl.Pb - p
	tol := gaugeSlipTol
	if fr.pbUnit.gauge == otherUnit.gauge {
		tol = gaugeSlipSameTol
	}
	if math.Abs(math.Abs(d)-gaugeSlipPsi) > tol {
		return nil
	}
	other = fr.names[other]
	where := "below"
	if d > 0 {
		where = "above"
	}
	pe := &ParseError{File: fr.names[FluidFile], Line: fl.Line[KeyPb], Column: 2, Header: fr.keys[KeyPb], Err: ErrMismatch,
		Msg: fmt.Sprintf("saturation pressure %s psia is %s psi %s the %s (%s psia, line %d)",
			fmtNum(roundTo(fl.Pb, 3)), fmtNum(roundTo(math.Abs(d), 2)), where, describe(other), fmtNum(roundTo(p, 3)), line)}
	// d < 0: the saturation pressure reads low (a gauge value written as absolute) or the
	// other reads high (an absolute value written as gauge); d > 0 the reverse.
	var c []string
	lowSide := d < 0
	if !pbConfirmed && fr.pbUnit.gauge != lowSide {
		c = append(c, "the saturation pressure "+slip(fr.pbUnit))
	}
	if otherUnit.gauge == lowSide {
		c = append(c, "the "+other+" pressure "+slip(otherUnit))
	}
	if len(c) == 0 {
		pe.Hint = "one of the two is probably a gauge pressure written as absolute, or the reverse"
	} else {
		pe.Hint = "was " + strings.Join(c, ", or ") + "?"
	}
	return pe
}

// slip names the mix-up of a value written in unit u.
func slip(u unitDef) string {
	if u.gauge {
		return "an absolute value written as " + u.name
	}
	return "a gauge value written as " + u.name
}

// gaugeSlip is the band of a psig/psia mix-up: one atmosphere, 14.696 psi, ± 0.5 psi for
// the rounding of reported pressures when one value is gauge and the other absolute, ± 0.1
// psi when both are written alike.
const (
	gaugeSlipPsi     = atmPsi
	gaugeSlipTol     = 0.5
	gaugeSlipSameTol = 0.1
)

// crossCheck finds slips that only show between files.
func (fr *folderReader) crossCheck(rep *Report) error {
	fl := rep.Fluid
	dlAgrees := false
	if len(rep.DL) > 0 && !rep.DL[0].Residual60 {
		dlAgrees = math.Abs(fl.Pb-rep.DL[0].Pressure) < gaugeSlipTol
		if err := fr.gaugeSlip(fl, DLFile, fr.dlUnit, rep.DL[0].Pressure, rep.DL[0].Line, false); err != nil {
			return err
		}
	}
	for _, c := range rep.CCE {
		if math.Abs(c.RelVolume-1) <= 5e-5 {
			if err := fr.gaugeSlip(fl, CCEFile, fr.cceUnit, c.Pressure, c.Line, dlAgrees); err != nil {
				return err
			}
			break
		}
	}
	if id := fl.SelectedTest; id != "" {
		var ids []string
		for _, t := range rep.Separator {
			if t.ID == id {
				return nil
			}
			ids = append(ids, strconv.Quote(t.ID))
		}
		pe := &ParseError{File: fr.names[FluidFile], Line: fl.Line[KeySelectedTest], Column: 2, Header: fr.keys[KeySelectedTest], Err: ErrMismatch}
		if len(ids) == 0 {
			pe.Msg = fmt.Sprintf("selected separator test %q, but the folder has no separator.csv", id)
		} else {
			pe.Msg = fmt.Sprintf("selected separator test %q is not in separator.csv (tests: %s)", id, strings.Join(ids, ", "))
		}
		return pe
	}
	return nil
}

func describe(file string) string {
	switch strings.ToLower(file) {
	case DLFile:
		return "first dl.csv stage"
	case CCEFile:
		return "cce.csv point at relative volume 1"
	}
	return file
}

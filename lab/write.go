package lab

import (
	"errors"
	"fmt"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
)

// UnitSet chooses one unit per quantity for writing. An empty field means the field unit,
// so the zero UnitSet writes field units.
type UnitSet struct {
	Pressure        string // psia, psig, bara, barg, kPa, MPa…
	Temperature     string // degF, degC, K
	GOR             string // scf/STB, sm3/sm3
	FVF             string // rb/STB, m3/sm3
	GasFVF          string // rcf/scf, rb/Mscf, m3/sm3
	Viscosity       string // cP, mPa.s
	Density         string // lbm/ft3, g/cm3, kg/m3
	Compressibility string // 1/psi, 1/bar, 1/kPa, 1/MPa
}

// FieldUnits returns the field unit set: psia, degF, scf/STB, rb/STB, rcf/scf, cP,
// lbm/ft3, 1/psi.
func FieldUnits() UnitSet {
	return UnitSet{
		Pressure: "psia", Temperature: "degF", GOR: "scf/STB", FVF: "rb/STB", GasFVF: "rcf/scf",
		Viscosity: "cP", Density: "lbm/ft3", Compressibility: "1/psi",
	}
}

// MetricUnits returns a metric unit set: bara, degC, sm3/sm3, m3/sm3, m3/sm3 (gas), mPa.s,
// kg/m3, 1/bar.
func MetricUnits() UnitSet {
	return UnitSet{
		Pressure: "bara", Temperature: "degC", GOR: "sm3/sm3", FVF: "m3/sm3", GasFVF: "m3/sm3",
		Viscosity: "mPa.s", Density: "kg/m3", Compressibility: "1/bar",
	}
}

// Unit returns the unit chosen for q, the field unit when none is.
func (s UnitSet) Unit(q Quantity) string {
	var u string
	switch q {
	case Pressure:
		u = s.Pressure
	case Temperature:
		u = s.Temperature
	case GOR:
		u = s.GOR
	case FVF:
		u = s.FVF
	case GasFVF:
		u = s.GasFVF
	case Viscosity:
		u = s.Viscosity
	case Density:
		u = s.Density
	case Compressibility:
		u = s.Compressibility
	}
	if u == "" {
		return q.FieldUnit()
	}
	return u
}

// Validate reports the first unit of s that is not a unit of its quantity.
func (s UnitSet) Validate() error {
	for _, q := range []Quantity{Pressure, Temperature, GOR, FVF, GasFVF, Viscosity, Density, Compressibility} {
		if _, err := CanonicalUnit(q, s.Unit(q)); err != nil {
			return err
		}
	}
	return nil
}

// WriteOptions are the options of WriteFolder. The zero value writes field units and
// refuses to overwrite.
type WriteOptions struct {
	Units UnitSet // units of the files; zero fields mean field units
	Force bool    // overwrite existing report files (and remove stale optional ones)
}

// WriteFolder writes r as a report folder that ReadFolder reads back: fluid.csv, dl.csv and
// each optional table that has rows, in the units of opts.Units, with a comment line at the
// top and "name [unit]" headers. Optional columns that are 0 in every row are left out.
// Numbers are written with at most 12 significant digits, so that a read–write–read cycle
// keeps values to 1e-11 relative.
//
// dir is created when missing. Each file is written to a temporary file in dir and then
// renamed over its name, so that a reader never sees half a file. Without opts.Force, an
// existing report file is an error wrapping fs.ErrExist and nothing is written; with it,
// report files that r does not fill (say an old cce.csv) are removed so that the folder
// holds r alone.
func WriteFolder(dir string, r *Report, opts WriteOptions) error {
	if r == nil {
		return errors.New("lab: WriteFolder: nil report")
	}
	u := opts.Units
	if err := u.Validate(); err != nil {
		return err
	}
	files, err := render(r, u)
	if err != nil {
		return err
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return fmt.Errorf("lab: %w", err)
	}
	all := []string{FluidFile, DLFile, SeparatorFile, CCEFile, ViscosityFile}
	if !opts.Force {
		for _, name := range all {
			p := filepath.Join(dir, name)
			if _, err := os.Lstat(p); err == nil {
				return fmt.Errorf("lab: %s exists; use --force to overwrite: %w", p, fs.ErrExist)
			}
		}
	}
	for _, name := range all {
		content, ok := files[name]
		if !ok {
			if opts.Force {
				if err := os.Remove(filepath.Join(dir, name)); err != nil && !errors.Is(err, fs.ErrNotExist) {
					return fmt.Errorf("lab: %w", err)
				}
			}
			continue
		}
		if err := writeAtomic(dir, name, content); err != nil {
			return err
		}
	}
	return nil
}

func writeAtomic(dir, name, content string) error {
	return WriteFileAtomic(filepath.Join(dir, name), []byte(content), true)
}

// csvWriter builds CSV text. It quotes a cell that holds a comma, a quote, a line end or
// surrounding spaces, or that starts a row with '#', which would read as a comment.
type csvWriter struct {
	b   strings.Builder
	err error
}

func (w *csvWriter) comment(s string) { w.b.WriteString("# " + s + "\n") }

func (w *csvWriter) row(cells ...string) {
	for i, c := range cells {
		if i > 0 {
			w.b.WriteByte(',')
		}
		if strings.ContainsAny(c, ",\"\r\n") || c != strings.TrimSpace(c) || i == 0 && strings.HasPrefix(c, "#") {
			c = `"` + strings.ReplaceAll(c, `"`, `""`) + `"`
		}
		w.b.WriteString(c)
	}
	w.b.WriteString("\n")
}

// value converts v from field units to unit and formats it; 0 means "not reported" in an
// optional column and is written as an empty cell.
func (w *csvWriter) value(q Quantity, unit string, v float64, optional bool) string {
	if optional && v == 0 {
		return ""
	}
	x, err := FromField(q, unit, v)
	if err == nil && (math.IsNaN(x) || math.IsInf(x, 0)) {
		err = fmt.Errorf("lab: cannot write %v: %w", v, ErrNotFinite)
	}
	if err != nil {
		if w.err == nil {
			w.err = err
		}
		return ""
	}
	return strconv.FormatFloat(x, 'g', writeDigits, 64)
}

// writeDigits is the number of significant digits written: enough that read → write → read
// keeps values to 1e-11 relative, few enough that a unit conversion's last-bit noise
// (115.55555555555556 °C) does not reach the file.
const writeDigits = 12

// column is one column of a written table.
type column struct {
	name string
	q    Quantity
	get  func(i int) float64
	opt  bool
}

func header(name string, q Quantity, u UnitSet) string {
	unit := u.Unit(q)
	if unit == "" || q == APIGravity {
		return name
	}
	c, _ := CanonicalUnit(q, unit)
	return name + " [" + c + "]"
}

// writeTable writes rows of the columns that have a non-zero value somewhere; text columns
// (label) come first when given.
func writeTable(w *csvWriter, n int, u UnitSet, labels []string, label func(i int) []string, cols []column) {
	var keep []column
	for _, c := range cols {
		if !c.opt {
			keep = append(keep, c)
			continue
		}
		for i := 0; i < n; i++ {
			if c.get(i) != 0 {
				keep = append(keep, c)
				break
			}
		}
	}
	head := append([]string(nil), labels...)
	for _, c := range keep {
		head = append(head, header(c.name, c.q, u))
	}
	w.row(head...)
	for i := 0; i < n; i++ {
		var cells []string
		if label != nil {
			cells = append(cells, label(i)...)
		}
		for _, c := range keep {
			cells = append(cells, w.value(c.q, u.Unit(c.q), c.get(i), c.opt))
		}
		w.row(cells...)
	}
}

// render returns the text of each file to write, by name.
func render(r *Report, u UnitSet) (map[string]string, error) {
	if len(r.DL) == 0 {
		return nil, fmt.Errorf("lab: the report has no DL stages to write: %w", ErrEmpty)
	}
	out := map[string]string{}
	note := "written by labmatch; units in each header (quantities internally in field units)"

	// fluid.csv
	var w csvWriter
	fl := r.Fluid
	w.comment("fluid description; " + note)
	w.row("key", "value", "unit")
	unitOf := func(q Quantity) string { c, _ := CanonicalUnit(q, u.Unit(q)); return c }
	num := func(key string, q Quantity, v float64) {
		w.row(key, w.value(q, u.Unit(q), v, false), unitOf(q))
	}
	if fl.Sample != "" {
		w.row(KeySample, fl.Sample)
	}
	num(KeyTemperature, Temperature, fl.Temperature)
	num(KeyPb, Pressure, fl.Pb)
	w.row(KeyAPI, w.value(APIGravity, "API", fl.API, false), "API")
	if fl.SepGasGravity != 0 {
		w.row(KeySepGasGravity, w.value(Dimensionless, "", fl.SepGasGravity, false))
	}
	for _, g := range []struct {
		key string
		v   float64
	}{{KeyH2S, fl.H2S}, {KeyCO2, fl.CO2}, {KeyN2, fl.N2}} {
		if g.v != 0 {
			w.row(g.key, w.value(MolePercent, "mol%", g.v, false), "mol%")
		}
	}
	sp, stdT := fl.StdPressure, fl.StdTemperature
	if sp == 0 {
		sp = DefaultStdPressure
	}
	if stdT == 0 {
		stdT = DefaultStdTemperature
	}
	num(KeyStdPressure, Pressure, sp)
	num(KeyStdTemperature, Temperature, stdT)
	if fl.SelectedTest != "" {
		w.row(KeySelectedTest, fl.SelectedTest)
	}
	out[FluidFile] = w.b.String()

	// dl.csv
	w = csvWriter{err: w.err}
	w.comment("differential liberation; " + note)
	dl := r.DL
	var labels []string
	var label func(int) []string
	for _, s := range dl {
		if s.Residual60 {
			labels = []string{"stage"}
			label = func(i int) []string {
				if dl[i].Residual60 {
					return []string{"residual oil at 60F"}
				}
				return []string{""}
			}
			break
		}
	}
	writeTable(&w, len(dl), u, labels, label, []column{
		{"pressure", Pressure, func(i int) float64 { return dl[i].Pressure }, false},
		{"Rsd", GOR, func(i int) float64 { return dl[i].Rsd }, false},
		{"Bod", FVF, func(i int) float64 { return dl[i].Bod }, false},
		{"Bt", FVF, func(i int) float64 { return dl[i].Bt }, true},
		{"oil density", Density, func(i int) float64 { return dl[i].OilDensity }, true},
		{"Z", Dimensionless, func(i int) float64 { return dl[i].Z }, true},
		{"Bg", GasFVF, func(i int) float64 { return dl[i].Bg }, true},
		{"gas gravity", Dimensionless, func(i int) float64 { return dl[i].GasGravity }, true},
	})
	out[DLFile] = w.b.String()

	// separator.csv: one row per stage; Bofb and API on each test's last row.
	if len(r.Separator) > 0 {
		type row struct {
			id        string
			st        SeparatorStage
			bofb, api float64
		}
		var rows []row
		for _, t := range r.Separator {
			if len(t.Stages) == 0 {
				return nil, fmt.Errorf("lab: separator test %q has no stages to write: %w", t.ID, ErrEmpty)
			}
			for k, st := range t.Stages {
				rw := row{id: t.ID, st: st}
				if k == len(t.Stages)-1 {
					rw.bofb, rw.api = t.Bofb, t.API
				}
				rows = append(rows, rw)
			}
		}
		w = csvWriter{err: w.err}
		w.comment("separator tests; " + note)
		writeTable(&w, len(rows), u, []string{"test", "stage"},
			func(i int) []string { return []string{rows[i].id, rows[i].st.Stage} },
			[]column{
				{"pressure", Pressure, func(i int) float64 { return rows[i].st.Pressure }, false},
				{"temperature", Temperature, func(i int) float64 { return rows[i].st.Temperature }, false},
				{"GOR", GOR, func(i int) float64 { return rows[i].st.GOR }, false},
				{"gas gravity", Dimensionless, func(i int) float64 { return rows[i].st.GasGravity }, true},
				{"Bofb", FVF, func(i int) float64 { return rows[i].bofb }, true},
				{"API", APIGravity, func(i int) float64 { return rows[i].api }, true},
			})
		out[SeparatorFile] = w.b.String()
	}

	if c := r.CCE; len(c) > 0 {
		w = csvWriter{err: w.err}
		w.comment("constant-composition expansion; " + note)
		writeTable(&w, len(c), u, nil, nil, []column{
			{"pressure", Pressure, func(i int) float64 { return c[i].Pressure }, false},
			{"relative volume", Dimensionless, func(i int) float64 { return c[i].RelVolume }, false},
			{"density", Density, func(i int) float64 { return c[i].Density }, true},
			{"Y", Dimensionless, func(i int) float64 { return c[i].Y }, true},
		})
		out[CCEFile] = w.b.String()
	}

	if v := r.Viscosity; len(v) > 0 {
		w = csvWriter{err: w.err}
		w.comment("oil viscosity; " + note)
		writeTable(&w, len(v), u, nil, nil, []column{
			{"pressure", Pressure, func(i int) float64 { return v[i].Pressure }, false},
			{"oil viscosity", Viscosity, func(i int) float64 { return v[i].Oil }, false},
			{"gas viscosity", Viscosity, func(i int) float64 { return v[i].Gas }, true},
		})
		out[ViscosityFile] = w.b.String()
	}
	if w.err != nil {
		return nil, w.err
	}
	return out, nil
}

package lab

import (
	"errors"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// tolRoundTrip is the relative tolerance of write → read: numbers are written with the
// shortest exact 'g' form, so only the unit conversion's rounding remains.
const tolRoundTrip = 1e-9

// inventedReport is a plausible black oil built in code. Every number is invented.
func inventedReport() *Report {
	return &Report{
		Fluid: Fluid{
			Sample: "INV-7, upper zone", Temperature: 212.5, Pb: 2745.3, API: 33.8,
			SepGasGravity: 0.812, H2S: 0.3, CO2: 2.1, N2: 0.45,
			StdPressure: 14.65, StdTemperature: 60, SelectedTest: "#2",
		},
		DL: []DLStage{
			{Pressure: 2745.3, Rsd: 702.4, Bod: 1.4123, Bt: 1.4123, OilDensity: 42.61, GasGravity: 0},
			{Pressure: 2300, Rsd: 611.9, Bod: 1.3691, Bt: 1.5014, OilDensity: 43.27, Z: 0.861, Bg: 0.006734, GasGravity: 0.801},
			{Pressure: 1700.25, Rsd: 487.1, Bod: 1.3105, Bt: 1.7380, OilDensity: 44.12, Z: 0.879, Bg: 0.009311, GasGravity: 0.812},
			{Pressure: 900, Rsd: 321.7, Bod: 1.2399, Bt: 2.6127, OilDensity: 45.35, Z: 0.912, Bg: 0.018250, GasGravity: 0.845},
			{Pressure: 14.7, Rsd: 0, Bod: 1.0812, OilDensity: 47.96, GasGravity: 1.412},
			{Pressure: 14.7, Residual60: true, Bod: 1, OilDensity: 51.83},
		},
		Separator: []SeparatorTest{
			{ID: "1", Bofb: 1.3561, API: 34.1, Stages: []SeparatorStage{
				{Stage: "1", Pressure: 114.7, Temperature: 72, GOR: 556.2, GasGravity: 0.742},
				{Stage: "stock tank", Pressure: 14.7, Temperature: 60, GOR: 88.4, GasGravity: 1.271},
			}},
			{ID: "#2", Bofb: 1.3498, API: 34.4, Stages: []SeparatorStage{
				{Stage: "1", Pressure: 314.7, Temperature: 75, GOR: 433.9, GasGravity: 0.701},
				{Stage: "2", Pressure: 64.7, Temperature: 70, GOR: 141.2, GasGravity: 0.952},
				{Stage: "stock tank", Pressure: 14.7, Temperature: 60, GOR: 51.6, GasGravity: 1.352},
			}},
		},
		CCE: []CCEPoint{
			{Pressure: 5000, RelVolume: 0.9712, Density: 43.87},
			{Pressure: 4000, RelVolume: 0.9815, Density: 43.41},
			{Pressure: 2745.3, RelVolume: 1, Density: 42.61},
			{Pressure: 2500, RelVolume: 1.0321, Y: 2.913},
			{Pressure: 1800, RelVolume: 1.2034, Y: 2.604},
		},
		Viscosity: []ViscosityPoint{
			{Pressure: 5000, Oil: 0.712},
			{Pressure: 2745.3, Oil: 0.583, Gas: 0.0201},
			{Pressure: 1200, Oil: 0.794, Gas: 0.0148},
			{Pressure: 14.7, Oil: 2.411, Gas: 0.0106},
		},
	}
}

func closeRel(a, b float64) bool {
	return math.Abs(a-b) <= tolRoundTrip*math.Max(math.Abs(a), math.Abs(b))
}

// compareReports compares every value of a and b, ignoring lines, Dir and Fingerprint.
func compareReports(t *testing.T, a, b *Report) {
	t.Helper()
	num := func(what string, x, y float64) {
		if !closeRel(x, y) {
			t.Errorf("%s: %.17g, read back %.17g", what, x, y)
		}
	}
	fa, fb := a.Fluid, b.Fluid
	if fa.Sample != fb.Sample || fa.SelectedTest != fb.SelectedTest {
		t.Errorf("fluid text: %q %q, read back %q %q", fa.Sample, fa.SelectedTest, fb.Sample, fb.SelectedTest)
	}
	for _, f := range []struct {
		n    string
		x, y float64
	}{
		{"T", fa.Temperature, fb.Temperature}, {"Pb", fa.Pb, fb.Pb}, {"API", fa.API, fb.API},
		{"SepGasGravity", fa.SepGasGravity, fb.SepGasGravity}, {"H2S", fa.H2S, fb.H2S},
		{"CO2", fa.CO2, fb.CO2}, {"N2", fa.N2, fb.N2}, {"StdPressure", fa.StdPressure, fb.StdPressure},
		{"StdTemperature", fa.StdTemperature, fb.StdTemperature},
	} {
		num("fluid "+f.n, f.x, f.y)
	}
	if len(a.DL) != len(b.DL) || len(a.Separator) != len(b.Separator) || len(a.CCE) != len(b.CCE) || len(a.Viscosity) != len(b.Viscosity) {
		t.Fatalf("table lengths differ: %d %d %d %d vs %d %d %d %d", len(a.DL), len(a.Separator), len(a.CCE), len(a.Viscosity),
			len(b.DL), len(b.Separator), len(b.CCE), len(b.Viscosity))
	}
	for i := range a.DL {
		x, y := a.DL[i], b.DL[i]
		if x.Residual60 != y.Residual60 {
			t.Errorf("DL[%d].Residual60 %v, read back %v", i, x.Residual60, y.Residual60)
		}
		for _, f := range [][2]float64{{x.Pressure, y.Pressure}, {x.Rsd, y.Rsd}, {x.Bod, y.Bod}, {x.Bt, y.Bt},
			{x.OilDensity, y.OilDensity}, {x.Z, y.Z}, {x.Bg, y.Bg}, {x.GasGravity, y.GasGravity}} {
			num("DL", f[0], f[1])
		}
	}
	for i := range a.Separator {
		x, y := a.Separator[i], b.Separator[i]
		if x.ID != y.ID || len(x.Stages) != len(y.Stages) {
			t.Fatalf("separator %d: %q/%d, read back %q/%d", i, x.ID, len(x.Stages), y.ID, len(y.Stages))
		}
		num("Bofb", x.Bofb, y.Bofb)
		num("API", x.API, y.API)
		for k := range x.Stages {
			p, q := x.Stages[k], y.Stages[k]
			if p.Stage != q.Stage {
				t.Errorf("stage %q, read back %q", p.Stage, q.Stage)
			}
			for _, f := range [][2]float64{{p.Pressure, q.Pressure}, {p.Temperature, q.Temperature}, {p.GOR, q.GOR}, {p.GasGravity, q.GasGravity}} {
				num("separator stage", f[0], f[1])
			}
		}
	}
	for i := range a.CCE {
		x, y := a.CCE[i], b.CCE[i]
		for _, f := range [][2]float64{{x.Pressure, y.Pressure}, {x.RelVolume, y.RelVolume}, {x.Density, y.Density}, {x.Y, y.Y}} {
			num("CCE", f[0], f[1])
		}
	}
	for i := range a.Viscosity {
		x, y := a.Viscosity[i], b.Viscosity[i]
		for _, f := range [][2]float64{{x.Pressure, y.Pressure}, {x.Oil, y.Oil}, {x.Gas, y.Gas}} {
			num("viscosity", f[0], f[1])
		}
	}
}

func TestRoundTrip(t *testing.T) {
	want := inventedReport()
	sets := map[string]UnitSet{
		"field":  FieldUnits(),
		"metric": MetricUnits(),
		"zero":   {},
		"gauge":  {Pressure: "psig", Temperature: "K", GOR: "m3/m3", GasFVF: "rb/Mscf", Density: "g/cm3", Viscosity: "Pa.s"},
		"barg":   {Pressure: "barg", Temperature: "degC", GasFVF: "rb/scf", Density: "kg/m3"},
		"kPag":   {Pressure: "kPag"},
		"MPa":    {Pressure: "MPa"},
	}
	for name, u := range sets {
		t.Run(name, func(t *testing.T) {
			dir := filepath.Join(t.TempDir(), "out") // does not exist yet
			if err := WriteFolder(dir, want, WriteOptions{Units: u}); err != nil {
				t.Fatal(err)
			}
			got, err := ReadFolder(dir)
			if err != nil {
				t.Fatal(err)
			}
			compareReports(t, want, got)
			// Read → write → read again is stable too, and writes the same bytes.
			dir2 := filepath.Join(t.TempDir(), "again")
			if err := WriteFolder(dir2, got, WriteOptions{Units: u}); err != nil {
				t.Fatal(err)
			}
			again, err := ReadFolder(dir2)
			if err != nil {
				t.Fatal(err)
			}
			compareReports(t, got, again)
			if again.Fingerprint != got.Fingerprint {
				t.Error("second write differs from the first")
			}
		})
	}
}

func TestWriteMetricHeaders(t *testing.T) {
	dir := t.TempDir()
	if err := WriteFolder(dir, inventedReport(), WriteOptions{Units: MetricUnits()}); err != nil {
		t.Fatal(err)
	}
	dl := readText(t, filepath.Join(dir, "dl.csv"))
	lines := strings.Split(dl, "\n")
	if !strings.HasPrefix(lines[0], "# ") {
		t.Errorf("no comment line: %q", lines[0])
	}
	if want := "stage,pressure [bara],Rsd [sm3/sm3],Bod [m3/sm3],Bt [m3/sm3],oil density [kg/m3],Z,Bg [m3/sm3],gas gravity"; lines[1] != want {
		t.Errorf("dl header\n%s\nwant\n%s", lines[1], want)
	}
	fluid := readText(t, filepath.Join(dir, "fluid.csv"))
	for _, s := range []string{"reservoir temperature,100.277777778,degC\n", "sample,\"INV-7, upper zone\"\n", "selected separator test,#2\n"} {
		if !strings.Contains(fluid, s) {
			t.Errorf("fluid.csv lacks %q:\n%s", s, fluid)
		}
	}
	sep := readText(t, filepath.Join(dir, "separator.csv"))
	if !strings.Contains(sep, "\n\"#2\",stock tank,1.01") || !strings.Contains(sep, ",34.4\n") {
		t.Errorf("separator.csv:\n%s", sep)
	}
}

// TestWriteOmitsEmpty leaves out optional tables and all-zero optional columns.
func TestWriteOmitsEmpty(t *testing.T) {
	r := &Report{
		Fluid: Fluid{Temperature: 200, Pb: 2500, API: 35},
		DL:    []DLStage{{Pressure: 2500, Rsd: 600, Bod: 1.35}, {Pressure: 14.696, Bod: 1.05, Z: 0.99}},
	}
	dir := t.TempDir()
	if err := WriteFolder(dir, r, WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	entries, _ := os.ReadDir(dir)
	var names []string
	for _, e := range entries {
		names = append(names, e.Name())
	}
	if strings.Join(names, " ") != "dl.csv fluid.csv" {
		t.Errorf("files %v, want dl.csv fluid.csv only (no temporary files)", names)
	}
	dl := readText(t, filepath.Join(dir, "dl.csv"))
	if !strings.Contains(dl, "pressure [psia],Rsd [scf/STB],Bod [rb/STB],Z\n2500,600,1.35,\n14.696,0,1.05,0.99\n") {
		t.Errorf("dl.csv:\n%s", dl)
	}
	got, err := ReadFolder(dir)
	if err != nil {
		t.Fatal(err)
	}
	if got.Fluid.StdPressure != DefaultStdPressure || got.Fluid.StdTemperature != DefaultStdTemperature {
		t.Errorf("standard conditions %+v", got.Fluid)
	}
}

func TestWriteRefusesOverwrite(t *testing.T) {
	dir := t.TempDir()
	r := inventedReport()
	if err := WriteFolder(dir, r, WriteOptions{}); err != nil {
		t.Fatal(err)
	}
	before := readText(t, filepath.Join(dir, "dl.csv"))
	err := WriteFolder(dir, r, WriteOptions{Units: MetricUnits()})
	if !errors.Is(err, fs.ErrExist) || !strings.HasPrefix(err.Error(), "lab: ") {
		t.Fatalf("second write: %v, want fs.ErrExist", err)
	}
	if readText(t, filepath.Join(dir, "dl.csv")) != before {
		t.Error("a refused write changed dl.csv")
	}
	// Force overwrites and removes the optional tables the new report lacks.
	small := *r
	small.CCE, small.Viscosity = nil, nil
	if err := WriteFolder(dir, &small, WriteOptions{Units: MetricUnits(), Force: true}); err != nil {
		t.Fatal(err)
	}
	if _, err := os.Stat(filepath.Join(dir, "cce.csv")); !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("stale cce.csv left: %v", err)
	}
	got, err := ReadFolder(dir)
	if err != nil {
		t.Fatal(err)
	}
	compareReports(t, &small, got)
}

func TestWriteErrors(t *testing.T) {
	dir := t.TempDir()
	r := inventedReport()
	for name, tc := range map[string]struct {
		r        *Report
		opts     WriteOptions
		sentinel error
	}{
		"bad unit":       {r, WriteOptions{Units: UnitSet{Pressure: "psi"}}, ErrUnknownUnit},
		"wrong quantity": {r, WriteOptions{Units: UnitSet{GOR: "bara"}}, ErrUnknownUnit},
		"no DL":          {&Report{Fluid: r.Fluid}, WriteOptions{}, ErrEmpty},
		"NaN":            {&Report{Fluid: Fluid{Temperature: math.NaN(), Pb: 1, API: 1}, DL: r.DL}, WriteOptions{}, ErrNotFinite},
		"empty test":     {&Report{Fluid: r.Fluid, DL: r.DL, Separator: []SeparatorTest{{ID: "x"}}}, WriteOptions{}, ErrEmpty},
	} {
		err := WriteFolder(filepath.Join(dir, strings.ReplaceAll(name, " ", "-")), tc.r, tc.opts)
		if !errors.Is(err, tc.sentinel) {
			t.Errorf("%s: %v, want %v", name, err, tc.sentinel)
		}
	}
	if err := WriteFolder(dir, nil, WriteOptions{}); err == nil {
		t.Error("nil report written")
	}
	// Nothing was written by the failed calls.
	if _, err := os.Stat(filepath.Join(dir, "bad-unit")); !errors.Is(err, fs.ErrNotExist) {
		t.Errorf("a failed write created its folder: %v", err)
	}
}

func TestUnitSet(t *testing.T) {
	var zero UnitSet
	if zero.Unit(Pressure) != "psia" || zero.Unit(Dimensionless) != "" || zero.Validate() != nil {
		t.Errorf("zero UnitSet: %q %q %v", zero.Unit(Pressure), zero.Unit(Dimensionless), zero.Validate())
	}
	if err := MetricUnits().Validate(); err != nil {
		t.Error(err)
	}
	f := FieldUnits()
	for _, q := range []Quantity{Pressure, Temperature, GOR, FVF, GasFVF, Viscosity, Density, Compressibility} {
		if f.Unit(q) != q.FieldUnit() {
			t.Errorf("FieldUnits %v = %q, want %q", q, f.Unit(q), q.FieldUnit())
		}
	}
}

func readText(t *testing.T, p string) string {
	t.Helper()
	b, err := os.ReadFile(p)
	if err != nil {
		t.Fatal(err)
	}
	return string(b)
}

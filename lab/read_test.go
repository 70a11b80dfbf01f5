package lab

import (
	"errors"
	"io"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"testing/fstest"
)

// tolRead is the tolerance of values read from the fixtures: the unit factors are exact, so
// only float64 rounding remains.
const tolRead = 1e-12

func near(a, b float64) bool { return math.Abs(a-b) <= tolRead*math.Max(1, math.Abs(b)) }

// TestReadGood reads testdata/good/basic (invented numbers) and checks the conversions.
func TestReadGood(t *testing.T) {
	r, err := ReadFolder("../testdata/good/basic")
	if err != nil {
		t.Fatal(err)
	}
	if r.Dir != "../testdata/good/basic" || len(r.Fingerprint) != 64 {
		t.Errorf("Dir %q, Fingerprint %q", r.Dir, r.Fingerprint)
	}
	fl := r.Fluid
	if fl.Sample != "BASIC-1" || fl.Temperature != 220 || fl.Pb != 2620 || fl.API != 36.5 ||
		fl.SepGasGravity != 0.78 || fl.CO2 != 1.2 || fl.N2 != 0.4 || fl.H2S != 0 ||
		fl.StdPressure != 14.696 || fl.StdTemperature != 60 || fl.SelectedTest != "B" {
		t.Errorf("fluid = %+v", fl)
	}
	if fl.Line[KeyPb] != 5 || fl.Line[KeySelectedTest] != 12 || fl.Line[KeySample] != 3 {
		t.Errorf("fluid lines = %v", fl.Line)
	}
	if len(r.DL) != 8 {
		t.Fatalf("%d DL stages, want 8", len(r.DL))
	}
	// dl.csv is in psig: 2605.304 psig + 14.696 = 2620 psia (common-practice gauge base).
	if !near(r.DL[0].Pressure, 2620) || r.DL[0].Line != 4 {
		t.Errorf("DL[0] = %+v", r.DL[0])
	}
	// Line numbers count comment and blank lines.
	if r.DL[3].Line != 8 || !near(r.DL[3].Pressure, 1114.696) {
		t.Errorf("DL[3] = %+v", r.DL[3])
	}
	// 0.6880 g/cm3 × 62.42796 lbm/ft3 per g/cm3 (NIST SP 811 B.8).
	if relErr(r.DL[0].OilDensity, 0.688*62.42796) > tolNIST7 {
		t.Errorf("DL[0].OilDensity = %g", r.DL[0].OilDensity)
	}
	if r.DL[0].Z != 0 || r.DL[1].Z != 0.87 || r.DL[1].Bg != 0.00845 || r.DL[6].GasGravity != 1.35 {
		t.Errorf("optional DL columns: %+v %+v", r.DL[0], r.DL[1])
	}
	for i, s := range r.DL {
		if s.Residual60 != (i == 7) {
			t.Errorf("DL[%d].Residual60 = %v", i, s.Residual60)
		}
	}
	if len(r.Separator) != 2 || r.Separator[0].ID != "A" || r.Separator[1].ID != "B" {
		t.Fatalf("separator = %+v", r.Separator)
	}
	b := r.Separator[1]
	if len(b.Stages) != 2 || b.Stages[1].Stage != "stock tank" || b.Bofb != 1.318 || b.API != 36.5 ||
		!near(b.Stages[0].Pressure, 114.696) || b.Rsfb() != 600 {
		t.Errorf("test B = %+v", b)
	}
	if sel, ok := r.SelectedSeparator(); !ok || sel.ID != "B" {
		t.Errorf("SelectedSeparator = %v, %v", sel.ID, ok)
	}
	if len(r.CCE) != 7 || r.CCE[3].RelVolume != 1 || r.CCE[4].Density != 0 {
		t.Errorf("CCE = %+v", r.CCE)
	}
	if len(r.Viscosity) != 4 || r.Viscosity[0].Gas != 0 || r.Viscosity[1].Oil != 0.48 {
		t.Errorf("viscosity = %+v", r.Viscosity)
	}
}

// TestReadCRLFBOM reads a good report written awkwardly: BOM, CRLF, comments, blank rows,
// metric units, synonyms, capitals, padding cells, a quoted sample name.
func TestReadCRLFBOM(t *testing.T) {
	r, err := ReadFolder("../testdata/bad/crlf-bom-ok")
	if err != nil {
		t.Fatal(err)
	}
	fl := r.Fluid
	// 93.3 °C = 199.94 °F; 180.6 bara = 180.6 × 14.50377 psia (NIST SP 811 B.8).
	if !near(fl.Temperature, 199.94) || relErr(fl.Pb, 180.6*14.50377) > tolNIST7 {
		t.Errorf("T = %g, Pb = %g", fl.Temperature, fl.Pb)
	}
	if fl.Sample != `CRLF, BOM "ok"` || fl.API != 35 || fl.Line[KeyResidualSG] != 10 {
		t.Errorf("fluid = %+v", fl)
	}
	if relErr(fl.StdPressure, 14.69595) > tolNIST7 || math.Abs(fl.StdTemperature-60) > 1e-4 {
		t.Errorf("standard conditions %g psia, %g °F", fl.StdPressure, fl.StdTemperature)
	}
	if len(r.DL) != 5 || !r.DL[4].Residual60 || r.DL[3].Residual60 || r.DL[2].Line != 6 {
		t.Fatalf("DL = %+v", r.DL)
	}
	// 107 sm3/sm3 × 5.614583 (check-values.md barrel).
	if relErr(r.DL[0].Rsd, 107*5.614583) > 1e-7 {
		t.Errorf("Rsd = %g", r.DL[0].Rsd)
	}
}

// TestReadResidualOilGravity: stock-tank API from the residual-oil specific gravity when
// no API row is given.
func TestReadResidualOilGravity(t *testing.T) {
	fsys := fstest.MapFS{
		"r/fluid.csv": {Data: []byte("reservoir temperature,200,degF\nsaturation pressure,2500,psia\nresidual oil gravity,0.823,\n")},
		"r/dl.csv":    {Data: []byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2500,600,1.35\n14.696,0,1.05\n")},
	}
	r, err := ReadFS(fsys, "r")
	if err != nil {
		t.Fatal(err)
	}
	// McCain, Properties of Petroleum Fluids, 2nd ed., problem 10-4: γo 0.823 = 40.43 °API.
	if math.Abs(r.Fluid.API-40.43) > tolAPI2dec || r.Dir != "" {
		t.Errorf("API = %g, Dir = %q", r.Fluid.API, r.Dir)
	}
}

// TestReadBad reads every broken fixture of testdata/bad and checks where and what.
func TestReadBad(t *testing.T) {
	tests := []struct {
		dir          string
		sentinel     error
		file         string
		line, column int
		text         string // in Error()
	}{
		{"missing-fluid", ErrMissingFile, "fluid.csv", 0, 0, "required file not found"},
		{"missing-dl", ErrMissingFile, "dl.csv", 0, 0, "found fluid.csv"},
		{"missing-column", ErrMissingColumn, "dl.csv", 2, 0, "no Bod column"},
		{"unknown-column", ErrUnknownColumn, "dl.csv", 2, 2, `unknown column "Rsx" (accepted: pressure, Rsd, Bod`},
		{"unknown-unit", ErrUnknownUnit, "dl.csv", 2, 2, `"bbl/day" is not a GOR unit (accepted: scf/STB, sm3/sm3)`},
		{"no-unit", ErrMissingUnit, "dl.csv", 2, 1, "hint: write it as pressure [psia]"},
		{"psi-ambiguous", ErrUnknownUnit, "dl.csv", 2, 1, "write psia or psig"},
		{"text-in-number", ErrNumber, "dl.csv", 4, 2, `(Rsd [scf/STB]): "four hundred" is not a number; expected a number`},
		{"unit-in-cell", ErrNumber, "dl.csv", 4, 2, "write the unit in the header"},
		{"decimal-comma", ErrRagged, "dl.csv", 4, 0, "expected 3 cells as in the header (line 2), got 4; hint: a decimal comma"},
		{"decimal-comma-padding", ErrRagged, "dl.csv", 6, 0, "got 6; the extra cells are empty but not a spreadsheet's padding (the header has 5 cells, the shortest row 5); hint: a decimal comma"},
		{"nan", ErrNotFinite, "dl.csv", 4, 3, `"NaN" is not a finite number`},
		{"inf", ErrNotFinite, "dl.csv", 4, 1, `"Inf" is not a finite number`},
		{"zero-pressure", ErrRange, "dl.csv", 6, 1, "0 psia is a vacuum"},
		{"negative-psig", ErrRange, "dl.csv", 6, 1, "-20 psig is below vacuum"},
		{"dl-not-decreasing", ErrOrder, "dl.csv", 4, 1, "2600 is not below the previous stage's 2500 (line 3)"},
		{"duplicate-key", ErrDuplicateKey, "fluid.csv", 6, 1, "given twice, on lines 4 and 6"},
		{"psig-slip", ErrMismatch, "fluid.csv", 4, 2, "hint: was the saturation pressure a gauge value written as psia?"},
		{"cce-psig-slip", ErrMismatch, "fluid.csv", 4, 2, "hint: was the cce.csv pressure an absolute value written as psig?"},
		{"header-only", ErrEmpty, "dl.csv", 2, 0, "header without data rows"},
		{"ragged", ErrRagged, "dl.csv", 4, 0, "expected 3 cells as in the header (line 2), got 2"},
		{"fahrenheit-as-celsius", ErrRange, "fluid.csv", 3, 2, "300 degC (572 degF) is outside the accepted range ≥ 32 and ≤ 500 degF; hint: this looks like a °F value"},
		{"semicolon", ErrSyntax, "dl.csv", 2, 0, "semicolon-separated"},
		{"no-header", ErrMissingColumn, "dl.csv", 2, 0, "start the file with a header line"},
		{"missing-pb", ErrMissingColumn, "fluid.csv", 0, 0, "no saturation pressure row"},
		{"unknown-selected-test", ErrMismatch, "fluid.csv", 6, 2, `selected separator test "C" is not in separator.csv (tests: "A")`},
		{"residual-not-last", ErrOrder, "dl.csv", 4, 0, "must be the last row"},
		{"latin1", ErrSyntax, "fluid.csv", 3, 0, "not valid UTF-8"},
		{"separator-after-stock-tank", ErrOrder, "separator.csv", 5, 2, "continues after its stock-tank stage (line 4)"},
	}
	seen := map[string]bool{}
	for _, tc := range tests {
		seen[tc.dir] = true
		t.Run(tc.dir, func(t *testing.T) {
			r, err := ReadFolder(filepath.Join("../testdata/bad", tc.dir))
			if r != nil {
				t.Errorf("got a report with the error %v", err)
			}
			checkParseError(t, err, tc.sentinel, tc.file, tc.line, tc.column, tc.text)
		})
	}
	// Every fixture folder is in the table (crlf-bom-ok is a good one, read above).
	entries, err := os.ReadDir("../testdata/bad")
	if err != nil {
		t.Fatal(err)
	}
	for _, e := range entries {
		if e.IsDir() && !seen[e.Name()] && e.Name() != "crlf-bom-ok" {
			t.Errorf("fixture %s has no test", e.Name())
		}
	}
}

func checkParseError(t *testing.T, err error, sentinel error, file string, line, column int, text string) {
	t.Helper()
	if !errors.Is(err, sentinel) {
		t.Fatalf("error %v, want %v", err, sentinel)
	}
	var pe *ParseError
	if !errors.As(err, &pe) {
		t.Fatalf("error %T is not a *ParseError", err)
	}
	if pe.Unwrap() != sentinel {
		t.Errorf("Unwrap() = %v, want the sentinel %v", pe.Unwrap(), sentinel)
	}
	if pe.File != file || pe.Line != line || pe.Column != column {
		t.Errorf("at %s:%d:%d, want %s:%d:%d", pe.File, pe.Line, pe.Column, file, line, column)
	}
	if msg := err.Error(); !strings.HasPrefix(msg, "lab: ") || !strings.Contains(msg, text) {
		t.Errorf("message %q\nwant it to contain %q", msg, text)
	}
}

func TestReadEmptyFolder(t *testing.T) {
	_, err := ReadFolder(t.TempDir())
	checkParseError(t, err, ErrMissingFile, "", 0, 0, "holds no CSV files")
}

func TestReadNotAFolder(t *testing.T) {
	_, err := ReadFolder("../testdata/good/basic/fluid.csv")
	checkParseError(t, err, ErrMissingFile, "../testdata/good/basic/fluid.csv", 0, 0, "not a folder")
	nowhere := filepath.Join(t.TempDir(), "nowhere")
	_, err = ReadFolder(nowhere)
	checkParseError(t, err, ErrMissingFile, nowhere, 0, 0, "report folder not found")
}

// countingFS counts the bytes read from each file.
type countingFS struct {
	fs.FS
	read map[string]int64
}

func (c *countingFS) Open(name string) (fs.File, error) {
	f, err := c.FS.Open(name)
	if err != nil {
		return nil, err
	}
	return &countingFile{File: f, name: name, fs: c}, nil
}

func (c *countingFS) ReadDir(name string) ([]fs.DirEntry, error) { return fs.ReadDir(c.FS, name) }

type countingFile struct {
	fs.File
	name string
	fs   *countingFS
}

func (f *countingFile) Read(p []byte) (int, error) {
	n, err := f.File.Read(p)
	f.fs.read[f.name] += int64(n)
	return n, err
}

// TestReadHugeFile refuses a file over MaxFileSize by its size, without reading it. The
// file is sparse and made at run time; it is never committed.
func TestReadHugeFile(t *testing.T) {
	dir := t.TempDir()
	copyFile(t, "../testdata/good/basic/fluid.csv", filepath.Join(dir, "fluid.csv"))
	f, err := os.Create(filepath.Join(dir, "dl.csv"))
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Truncate(MaxFileSize + 1<<20); err != nil {
		t.Fatal(err)
	}
	f.Close()
	cfs := &countingFS{FS: os.DirFS(dir), read: map[string]int64{}}
	_, err = ReadFS(cfs, ".")
	checkParseError(t, err, ErrTooLarge, "dl.csv", 0, 0, "file is 11.0 MiB (11534336 bytes), larger than the limit of 10.0 MiB")
	if n := cfs.read["dl.csv"]; n != 0 {
		t.Errorf("read %d bytes of the huge file, want 0", n)
	}
	if cfs.read["fluid.csv"] == 0 {
		t.Error("fluid.csv was not read through the counting FS")
	}
}

// lyingFS reports a small size for every file, to check the bounded read.
type lyingFS struct{ fs.FS }

type smallInfo struct{ fs.FileInfo }

func (smallInfo) Size() int64 { return 10 }

func (l lyingFS) Stat(name string) (fs.FileInfo, error) {
	fi, err := fs.Stat(l.FS, name)
	if err != nil {
		return nil, err
	}
	return smallInfo{fi}, nil
}

func TestReadGrowingFile(t *testing.T) {
	big := strings.Repeat("#\n", MaxFileSize/2+1)
	fsys := lyingFS{fstest.MapFS{
		"fluid.csv": {Data: []byte("reservoir temperature,200,degF\nsaturation pressure,2500,psia\nAPI,35\n")},
		"dl.csv":    {Data: []byte(big)},
	}}
	_, err := ReadFS(fsys, ".")
	checkParseError(t, err, ErrTooLarge, "dl.csv", 0, 0, "larger than the limit")
}

func copyFile(t *testing.T, from, to string) {
	t.Helper()
	b, err := os.ReadFile(from)
	if err != nil {
		t.Fatal(err)
	}
	if err := os.WriteFile(to, b, 0o644); err != nil {
		t.Fatal(err)
	}
}

// TestFingerprint: the same files give the same fingerprint, and any byte changes it.
func TestFingerprint(t *testing.T) {
	base := fstest.MapFS{
		"fluid.csv": {Data: []byte("reservoir temperature,200,degF\nsaturation pressure,2500,psia\nAPI,35\n")},
		"dl.csv":    {Data: []byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2500,600,1.35\n")},
		"notes.txt": {Data: []byte("not part of the report")},
	}
	a, err := ReadFS(base, ".")
	if err != nil {
		t.Fatal(err)
	}
	base["notes.txt"] = &fstest.MapFile{Data: []byte("changed, but never read")}
	b, _ := ReadFS(base, ".")
	base["dl.csv"] = &fstest.MapFile{Data: []byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2500,600,1.36\n")}
	c, _ := ReadFS(base, ".")
	if a.Fingerprint != b.Fingerprint || a.Fingerprint == c.Fingerprint {
		t.Errorf("fingerprints %s %s %s", a.Fingerprint, b.Fingerprint, c.Fingerprint)
	}
}

// TestReadCells covers single-file rules with inline data.
func TestReadCells(t *testing.T) {
	fluid := "reservoir temperature,200,degF\nsaturation pressure,2500,psia\nAPI,35\n"
	dlHead := "pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n"
	tests := []struct {
		name      string
		fluid, dl string
		extra     map[string]string
		sentinel  error
		file      string
		line, col int
		text      string
	}{
		{"ok with padding cells", fluid, dlHead + "2500,600,1.35,,\n", nil, nil, "", 0, 0, ""},
		{"ok upper-case file name", "", dlHead + "2500,600,1.35\n", map[string]string{"FLUID.CSV": fluid}, nil, "", 0, 0, ""},
		{"ok with a padded header and shorter rows below", fluid, "pressure [psia],Rsd [scf/STB],Bod [rb/STB],,\n2500,600,1.35,,\n14.696,0,1.05\n", nil, nil, "", 0, 0, ""},
		{"ok with every row padded alike", fluid, dlHead + "2500,600,1.35,\n14.696,0,1.05,\n", nil, nil, "", 0, 0, ""},
		{"one row padded beyond the others", fluid, dlHead + "2500,600,1.35\n14.696,0,1.05,\n", nil, ErrRagged, "dl.csv", 3, 0, "not a spreadsheet's padding"},
		{"padding with text is ragged", fluid, dlHead + "2500,600,1.35,,x\n", nil, ErrRagged, "dl.csv", 2, 0, "got 5"},
		{"empty required cell", fluid, dlHead + "2500,,1.35\n", nil, ErrNumber, "dl.csv", 2, 2, "empty cell"},
		{"decimal comma in quotes", fluid, dlHead + "2500,\"600,5\",1.35\n", nil, ErrNumber, "dl.csv", 2, 2, "decimal separator"},
		{"thousands separator", fluid, dlHead + "\"2,500.0\",600,1.35\n", nil, ErrNumber, "dl.csv", 2, 1, "thousands separators"},
		{"huge number", fluid, dlHead + "1e999,600,1.35\n", nil, ErrNotFinite, "dl.csv", 2, 1, "beyond the range"},
		{"pressure too high", fluid, dlHead + "2500,600,1.35\n\"60000\",0,1\n", nil, ErrRange, "dl.csv", 3, 1, "60000 psia is outside"},
		{"negative Rsd", fluid, dlHead + "2500,-6,1.35\n", nil, ErrRange, "dl.csv", 2, 2, "≥ 0"},
		{"duplicate column", fluid, "pressure [psia],Rs [scf/STB],Bod [rb/STB],Rsd [scf/STB]\n1,2,3,4\n", nil, ErrDuplicateKey, "dl.csv", 1, 4, "column Rsd is given twice (cells 2 and 4)"},
		{"parenthesised unit", fluid, "pressure (psia),Rsd [scf/STB],Bod [rb/STB]\n", nil, ErrUnknownColumn, "dl.csv", 1, 1, "hint: write the unit in square brackets: pressure [psia]"},
		{"open bracket", fluid, "pressure [psia,Rsd [scf/STB],Bod [rb/STB]\n", nil, ErrUnknownColumn, "dl.csv", 1, 1, "not of the form name [unit]"},
		{"unit on text column", fluid, "stage [psia],pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n", nil, ErrUnknownUnit, "dl.csv", 1, 1, "takes no unit"},
		{"unit of another quantity", fluid, "pressure [psia],Rsd [rb/STB],Bod [rb/STB]\n", nil, ErrUnknownUnit, "dl.csv", 1, 2, "rb/STB is a FVF unit"},
		{"empty dl", fluid, "", nil, ErrEmpty, "dl.csv", 0, 0, "no header"},
		{"comments only", fluid, "# a\n  # b\n", nil, ErrEmpty, "dl.csv", 0, 0, "no header"},
		{"bad quote", fluid, dlHead + "2500,6\"00,1.35\n", nil, ErrSyntax, "dl.csv", 2, 0, "double quotes"},
		{"UTF-16", fluid, "\xff\xfep\x00", nil, ErrSyntax, "dl.csv", 0, 0, "UTF-16"},
		{"Bod zero", fluid, dlHead + "2500,600,0\n", nil, ErrRange, "dl.csv", 2, 3, "> 0"},
		{"equal pressures", fluid, dlHead + "2500,600,1.35\n2500,500,1.3\n", nil, ErrOrder, "dl.csv", 3, 1, "not below"},
		{"fluid unknown key", fluid + "colour,brown\n", dlHead + "2500,600,1.35\n", nil, ErrUnknownColumn, "fluid.csv", 4, 1, `unknown key "colour" (accepted: sample, reservoir temperature`},
		{"fluid no unit", "reservoir temperature,200\n", dlHead, nil, ErrMissingUnit, "fluid.csv", 1, 3, "write it as: reservoir temperature,200,degF"},
		{"fluid psi", fluid + "standard pressure,14.65,psi\n", dlHead, nil, ErrUnknownUnit, "fluid.csv", 4, 3, "write psia or psig"},
		{"fluid four cells", fluid + "CO2,1,mol%,x\n", dlHead, nil, ErrRagged, "fluid.csv", 4, 0, "expected 3 cells"},
		{"fluid text with unit", fluid + "sample,A,psia\n", dlHead, nil, ErrUnknownUnit, "fluid.csv", 4, 3, "takes no unit"},
		{"fluid no API", "reservoir temperature,200,degF\nsaturation pressure,2500,psia\n", dlHead, nil, ErrMissingColumn, "fluid.csv", 0, 0, "no stock-tank API row"},
		{"fluid header only", "key,value,unit\n", dlHead, nil, ErrEmpty, "fluid.csv", 0, 0, "no key,value,unit rows"},
		{"fluid cold °F", "reservoir temperature,25,degF\nsaturation pressure,2500,psia\nAPI,35\n", dlHead, nil, ErrRange, "fluid.csv", 1, 2, "hint: this looks like a °C value: was the unit degC?"},
		{"fluid sour sum", fluid + "H2S,50,%\nCO2,40,%\nN2,20,%\n", dlHead, nil, ErrRange, "fluid.csv", 0, 0, "more than 100"},
		{"fluid API zero", "reservoir temperature,200,degF\nsaturation pressure,2500,psia\nAPI,0\n", dlHead, nil, ErrRange, "fluid.csv", 3, 2, "> 0 and ≤ 100 °API"},
		{"selected test without separator.csv", fluid + "selected separator test,1\n", dlHead + "2500,600,1.35\n", nil, ErrMismatch, "fluid.csv", 4, 2, "no separator.csv"},
		{"psia slip the other way", "reservoir temperature,200,degF\nsaturation pressure,2500,psig\nAPI,35\n", dlHead + "2500,600,1.35\n", nil, ErrMismatch, "fluid.csv", 2, 2,
			"14.7 psi above the first dl.csv stage (2500 psia, line 2); hint: was the saturation pressure an absolute value written as psig, or the dl.csv pressure a gauge value written as psia?"},
		{"separator duplicate stage", fluid, dlHead + "2500,600,1.35\n", map[string]string{"separator.csv": "test,stage,pressure [psia],temperature [degF],GOR [scf/STB]\nA,1,100,70,400\nA,1,50,70,100\n"}, ErrDuplicateKey, "separator.csv", 3, 2, `stage "1" of test "A" is given twice, on lines 2 and 3`},
		{"separator pressure order", fluid, dlHead + "2500,600,1.35\n", map[string]string{"separator.csv": "test,stage,pressure [psia],temperature [degF],GOR [scf/STB]\nA,1,100,70,400\nA,2,150,70,100\n"}, ErrOrder, "separator.csv", 3, 3, "separator stages go down in pressure"},
		{"separator Bofb twice", fluid, dlHead + "2500,600,1.35\n", map[string]string{"separator.csv": "test,stage,pressure [psia],temperature [degF],GOR [scf/STB],Bofb [rb/STB]\nA,1,100,70,400,1.3\nA,ST,14.7,60,100,1.31\n"}, ErrDuplicateKey, "separator.csv", 3, 6, "different values, on lines 2 and 3"},
		{"separator empty test id", fluid, dlHead + "2500,600,1.35\n", map[string]string{"separator.csv": "test,stage,pressure [psia],temperature [degF],GOR [scf/STB]\n,1,100,70,400\n"}, ErrEmpty, "separator.csv", 2, 1, "every row names its test"},
		{"cce header only", fluid, dlHead + "2500,600,1.35\n", map[string]string{"cce.csv": "pressure [psia],V/Vsat\n"}, ErrEmpty, "cce.csv", 1, 0, "header without data"},
		{"viscosity no unit", fluid, dlHead + "2500,600,1.35\n", map[string]string{"viscosity.csv": "pressure [psia],oil viscosity\n3000,1\n"}, ErrMissingUnit, "viscosity.csv", 1, 2, "column oil viscosity needs a unit"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			fsys := fstest.MapFS{"dl.csv": {Data: []byte(tc.dl)}}
			if tc.fluid != "" {
				fsys["fluid.csv"] = &fstest.MapFile{Data: []byte(tc.fluid)}
			}
			for n, d := range tc.extra {
				fsys[n] = &fstest.MapFile{Data: []byte(d)}
			}
			r, err := ReadFS(fsys, ".")
			if tc.sentinel == nil {
				if err != nil || r == nil {
					t.Fatalf("error %v", err)
				}
				return
			}
			if r != nil {
				t.Errorf("got a report with error %v", err)
			}
			checkParseError(t, err, tc.sentinel, tc.file, tc.line, tc.col, tc.text)
		})
	}
}

func TestParseErrorFormat(t *testing.T) {
	for _, tc := range []struct {
		e    ParseError
		want string
	}{
		{ParseError{File: "dl.csv", Line: 7, Column: 2, Header: "Rsd [scf/STB]", Err: ErrNumber, Msg: `"x" is not a number`, Hint: "h"},
			`lab: dl.csv:7:2 (Rsd [scf/STB]): "x" is not a number; hint: h`},
		{ParseError{File: "dl.csv", Line: 7, Err: ErrRagged}, "lab: dl.csv:7: wrong number of cells"},
		{ParseError{File: "fluid.csv", Err: ErrMissingFile, Msg: "m"}, "lab: fluid.csv: m"},
		{ParseError{Err: ErrUnknownUnit, Msg: "m"}, "lab: m"},
		{ParseError{Header: "pressure", Err: ErrUnknownUnit, Msg: "m"}, "lab: (pressure): m"},
	} {
		if got := tc.e.Error(); got != tc.want {
			t.Errorf("Error() = %q, want %q", got, tc.want)
		}
	}
}

var _ io.Reader = (*countingFile)(nil)

var sinkReport *Report

// BenchmarkReadFS reads the basic fixture (five small tables) from memory.
func BenchmarkReadFS(b *testing.B) {
	fsys := fstest.MapFS{}
	for _, n := range []string{FluidFile, DLFile, SeparatorFile, CCEFile, ViscosityFile} {
		data, err := os.ReadFile(filepath.Join("../testdata/good/basic", n))
		if err != nil {
			b.Fatal(err)
		}
		fsys[n] = &fstest.MapFile{Data: data}
	}
	b.ReportAllocs()
	for b.Loop() {
		r, err := ReadFS(fsys, ".")
		if err != nil {
			b.Fatal(err)
		}
		sinkReport = r
	}
}

var sinkFloat float64

func BenchmarkParseValue(b *testing.B) {
	b.ReportAllocs()
	for b.Loop() {
		v, err := ParseValue(Pressure, "150 bara")
		if err != nil {
			b.Fatal(err)
		}
		sinkFloat = v
	}
}

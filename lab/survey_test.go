package lab

import (
	"errors"
	"math"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// surveyRelTol is the agreement of the field and metric six-oil files: the metric file holds the
// converted values to 10 significant digits, and its gauge separator pressures are read from
// 1.01325 bar = 14.69595 psia instead of 14.696 (4e-7 of a 115 psia separator).
const surveyRelTol = 1e-6

// The six-oil table (Ahmed, Reservoir Engineering Handbook, ch. 2, from memory; see
// testdata/survey) reads the same in field and metric units, and oil 1 is read as printed.
func TestReadSurveySixOils(t *testing.T) {
	field, err := ReadSurvey("../testdata/survey/six-oils-field.csv")
	if err != nil {
		t.Fatal(err)
	}
	metric, err := ReadSurvey("../testdata/survey/six-oils-metric.csv")
	if err != nil {
		t.Fatal(err)
	}
	if len(field.Samples) != 6 || len(metric.Samples) != 6 || len(field.Excluded)+len(metric.Excluded) != 0 {
		t.Fatalf("want 6 samples each and no exclusions; got %d, %d, excluded %v %v",
			len(field.Samples), len(metric.Samples), field.Excluded, metric.Excluded)
	}
	o1 := field.Samples[0]
	// Oil 1 as printed: 250 °F, Pb 2377 psia, Rsb 751 scf/STB, Bob 1.528, separator 150 psig
	// and 60 °F, 47.1 °API, γg 0.851 (Ahmed, ch. 2, from memory).
	want := SurveySample{Line: o1.Line, ID: "oil 1", Temperature: 250, Pb: 2377, Rsb: 751, Bob: 1.528,
		SepPressure: 150 + 14.696, SepTemperature: 60, API: 47.1, GasGravity: 0.851}
	if o1 != want {
		t.Errorf("oil 1: got %+v, want %+v", o1, want)
	}
	for i := range field.Samples {
		f, m := field.Samples[i], metric.Samples[i]
		pairs := [][2]float64{{f.Temperature, m.Temperature}, {f.Pb, m.Pb}, {f.Rsb, m.Rsb}, {f.Bob, m.Bob},
			{f.SepPressure, m.SepPressure}, {f.SepTemperature, m.SepTemperature}, {f.API, m.API}, {f.GasGravity, m.GasGravity}}
		for k, p := range pairs {
			if math.Abs(p[1]/p[0]-1) > surveyRelTol {
				t.Errorf("%s value %d: field %.10g, metric %.10g", f.ID, k, p[0], p[1])
			}
		}
		if f.ID != m.ID {
			t.Errorf("sample %d: ids %q and %q", i, f.ID, m.ID)
		}
	}
	if field.Fingerprint == metric.Fingerprint || len(field.Fingerprint) != 64 {
		t.Errorf("fingerprints %q, %q", field.Fingerprint, metric.Fingerprint)
	}
}

const surveyHeader = "sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psia]"

// Broken survey files: a located error wrapping the expected sentinel, and no survey.
func TestReadSurveyErrors(t *testing.T) {
	for _, tc := range []struct {
		name, data string
		err        error
		line, col  int
		msg        string // part of the message
	}{
		{"empty", "", ErrEmpty, 0, 0, "no header"},
		{"header only", surveyHeader + "\n", ErrEmpty, 1, 0, "without data"},
		{"no unit", "sample,temperature,API,gas gravity,Rsb [scf/STB],Pb [psia]\nA,200,35,0.8,500,2000\n", ErrMissingUnit, 1, 2, "needs a unit"},
		{"unknown unit", "sample,temperature [degF],API,gas gravity,Rsb [bbl/d],Pb [psia]\nA,200,35,0.8,500,2000\n", ErrUnknownUnit, 1, 5, "bbl/d"},
		{"psi", "sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psi]\nA,200,35,0.8,500,2000\n", ErrUnknownUnit, 1, 6, "absolute or gauge"},
		{"unknown column", surveyHeader + ",porosity []\nA,200,35,0.8,500,2000,0.2\n", ErrUnknownColumn, 1, 7, "porosity"},
		{"missing Pb", "sample,temperature [degF],API,gas gravity,Rsb [scf/STB]\nA,200,35,0.8,500\n", ErrMissingColumn, 1, 0, "no Pb column"},
		{"duplicate column", surveyHeader + ",bubble point [psia]\nA,200,35,0.8,500,2000,2000\n", ErrDuplicateKey, 1, 7, "twice"},
		{"decimal comma", surveyHeader + "\nA,200,35,0.8,500,\"2000,5\"\n", ErrNumber, 2, 6, "not a number"},
		{"text in a number", surveyHeader + "\nA,200,35,0.8,n/a,2000\n", ErrNumber, 2, 5, "n/a"},
		{"NaN", surveyHeader + "\nA,200,35,0.8,NaN,2000\n", ErrNotFinite, 2, 5, "finite"},
		{"ragged", surveyHeader + "\nA,200,35,0.8,500\n", ErrRagged, 2, 0, "expected 6 cells"},
		{"decimal comma before an empty last column", surveyHeader + ",note\nA,200,35,0.8,500,2000,\nB,200,35,0,8,500,2000,\n", ErrRagged, 3, 0, "decimal comma"},
		{"semicolons", "sample;temperature [degF];API\nA;200;35\n", ErrSyntax, 1, 0, "semicolon"},
		{"quote", surveyHeader + "\nA,200,35,0.8,500,\"2000\n", ErrSyntax, 2, 0, ""},
		{"latin-1", "sample,temperature [\xb0F],API,gas gravity,Rsb [scf/STB],Pb [psia]\nA,200,35,0.8,500,2000\n", ErrSyntax, 1, 0, "UTF-8"},
	} {
		sv, err := ParseSurvey("db.csv", []byte(tc.data))
		var pe *ParseError
		if sv != nil || !errors.As(err, &pe) || !errors.Is(err, tc.err) {
			t.Errorf("%s: got %v (%v), want a *ParseError wrapping %v", tc.name, sv, err, tc.err)
			continue
		}
		if pe.File != "db.csv" || pe.Line != tc.line || pe.Column != tc.col || !strings.Contains(err.Error(), tc.msg) {
			t.Errorf("%s: %q at %d:%d, want line %d column %d containing %q", tc.name, err, pe.Line, pe.Column, tc.line, tc.col, tc.msg)
		}
		if !strings.HasPrefix(err.Error(), "lab: db.csv") {
			t.Errorf("%s: message %q does not start with the file", tc.name, err)
		}
	}
}

// Rows outside physical bounds are left out with their line and reason, never used; values of
// the optional columns are left out alone; good rows around them are read.
func TestReadSurveyExclusions(t *testing.T) {
	data := "# a database with slips\n" +
		"sample,temperature [degF],API,gas gravity,Rsb [scf/STB],Pb [psia],Bob [rb/STB],dead oil viscosity [cP],oil viscosity at Pb [cP],separator pressure [psia]\n" +
		"good,200,35,0.8,500,2000,1.28,3.1,1.2,100\n" + // line 3
		"celsius,93,35,0.8,500,2000,,,,\n" + // line 4: fine (93 °F is possible)
		"cold,25,35,0.8,500,2000,,,,\n" + // line 5: below 32 °F, a °C value
		"light gas,200,35,0.45,500,2000,,,,\n" + // line 6: lighter than methane
		"no pb,200,35,0.8,500,,,,,\n" + // line 7: required value missing
		"low pb,200,35,0.8,500,10,,,,\n" + // line 8: Pb below one atmosphere
		"shrunk,200,35,0.8,500,2000,0.92,,,\n" + // line 9: Bob below 1, value left out
		"thick,200,35,0.8,500,2100,1.3,2.0,2.5,\n" + // line 10: μob above μod, both left out
		"sep,200,35,0.8,500,2000,,,,2500\n" + // line 11: separator above Pb
		"good,200,35,0.8,500,2000,1.28,3.1,1.2,100\n" + // line 12: duplicate of line 3
		",210,36,0.8,520,2050,,,,\n" // line 13: no sample id
	sv, err := ParseSurvey("db.csv", []byte(data))
	if err != nil {
		t.Fatal(err)
	}
	if sv.Rows != 11 {
		t.Errorf("rows %d, want 11", sv.Rows)
	}
	var ids []string
	for _, s := range sv.Samples {
		ids = append(ids, s.ID)
	}
	if got := strings.Join(ids, "|"); got != "good|celsius|shrunk|thick|line 13" {
		t.Errorf("samples %s", got)
	}
	want := []struct {
		line    int
		columns string
		reason  string
	}{
		{5, "", "was the unit degC"},
		{6, "", "gas gravity"},
		{7, "", "no Pb value"},
		{8, "", "outside the accepted range"},
		{9, "Bob", "left out"},
		{10, "dead oil viscosity,oil viscosity at Pb", "gas in solution thins"},
		{11, "", "not below Pb"},
		{12, "", "same values as line 3"},
	}
	if len(sv.Excluded) != len(want) {
		t.Fatalf("exclusions %+v", sv.Excluded)
	}
	for i, w := range want {
		e := sv.Excluded[i]
		if e.Line != w.line || strings.Join(e.Columns, ",") != w.columns || !strings.Contains(e.Reason, w.reason) {
			t.Errorf("exclusion %d: %+v, want line %d columns %q reason with %q", i, e, w.line, w.columns, w.reason)
		}
	}
	for _, s := range sv.Samples {
		switch s.ID {
		case "shrunk":
			if s.Bob != 0 || s.Pb != 2000 {
				t.Errorf("shrunk: %+v", s)
			}
		case "thick":
			if s.DeadViscosity != 0 || s.SatViscosity != 0 || s.Bob != 1.3 {
				t.Errorf("thick: %+v", s)
			}
		}
	}
}

func TestReadSurveyFile(t *testing.T) {
	if _, err := ReadSurvey("no-such-file.csv"); !errors.Is(err, ErrMissingFile) {
		t.Errorf("missing file: %v", err)
	}
	if _, err := ReadSurvey(t.TempDir()); !errors.Is(err, ErrMissingFile) || !strings.Contains(err.Error(), "folder") {
		t.Errorf("a folder: %v", err)
	}
	// A spreadsheet's padding, alike on every row, is accepted.
	if sv, err := ParseSurvey("db.csv", []byte(surveyHeader+",,\nA,200,35,0.8,500,2000,,\nB,210,35,0.8,500,2100,,\n")); err != nil || len(sv.Samples) != 2 {
		t.Errorf("padded rows: %v", err)
	}
	p := filepath.Join(t.TempDir(), "db.csv")
	if err := os.WriteFile(p, []byte("\xef\xbb\xbf"+surveyHeader+"\r\nA,200,35,0.8,500,2000\r\n"), 0o644); err != nil {
		t.Fatal(err)
	}
	sv, err := ReadSurvey(p)
	if err != nil || len(sv.Samples) != 1 || sv.Samples[0].Pb != 2000 || sv.File != p {
		t.Errorf("BOM and CRLF: %+v, %v", sv, err)
	}
}

// FuzzParseSurvey: the reader never panics; it returns a *ParseError, or samples whose every
// value is finite and inside the bounds of its column.
func FuzzParseSurvey(f *testing.F) {
	for _, s := range []string{
		surveyHeader + "\nA,200,35,0.8,500,2000\n",
		"sample,T [degC],API,gas gravity,Rsb [sm3/sm3],Pb [MPa],Bob [m3/sm3],mu_dead [mPa.s],mu_sat [mPa.s],psep [barg],Tsep [degC]\nB,93,35,0.8,90,14,1.3,3,1,6,20\n",
		surveyHeader + "\nA,200,35,0.8,500,1e309\n",
		surveyHeader + "\nA,-1,35,0.8,500,2000\n,,,,,\n",
		"a;b\n1;2\n",
	} {
		f.Add([]byte(s))
	}
	for _, p := range []string{"../testdata/survey/six-oils-field.csv", "../testdata/survey/six-oils-metric.csv"} {
		if b, err := os.ReadFile(p); err == nil {
			f.Add(b)
		}
	}
	f.Fuzz(func(t *testing.T, data []byte) {
		sv, err := ParseSurvey("db.csv", data)
		if err != nil {
			var pe *ParseError
			if !errors.As(err, &pe) {
				t.Fatalf("error %v is not a *ParseError", err)
			}
			return
		}
		for _, s := range sv.Samples {
			for col, v := range map[string]float64{SurveyColTemperature: s.Temperature, SurveyColAPI: s.API,
				SurveyColGasGravity: s.GasGravity, SurveyColRsb: s.Rsb, SurveyColPb: s.Pb} {
				lo, hi, open, _ := SurveyBounds(col)
				if math.IsNaN(v) || v > hi || v < lo || open && v == lo {
					t.Fatalf("line %d: %s = %g outside its bounds", s.Line, col, v)
				}
			}
			for _, v := range []float64{s.Bob, s.DeadViscosity, s.SatViscosity, s.SepPressure, s.SepTemperature} {
				if math.IsNaN(v) || math.IsInf(v, 0) {
					t.Fatalf("line %d: a value is not finite: %+v", s.Line, s)
				}
			}
		}
	})
}

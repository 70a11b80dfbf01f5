package lab

import (
	"bytes"
	"math"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"
)

// Numbers of the invented black oil (no published source; invented for these tests).
const (
	invT      = 200.0  // °F
	invPb     = 2500.0 // psia
	invAPI    = 35.0
	invYA     = 1.80   // Y = a + b·p below Pb
	invYB     = 6.0e-4 // 1/psi
	invCoC1   = 1.2e-5 // ln V = −c1·x − c2·x² above Pb, x = p − Pb
	invCoC2   = -8e-10
	invSatIdx = 6 // index of the CCE point at Pb in cceGrid(invPb)
)

// inventedReport builds a plausible, self-consistent invented black oil as a laboratory
// would print it. Invented primary data: the DL pressures, Rsd, Bod, liberated-gas gravity
// and Z; two separator tests; a CCE with a straight Y line. Derived as the identities of
// the trade demand (rounded as a report prints them): Bg = psc·Z·T/(Tsc·p) (real-gas law),
// Bt = Bod + Bg·(Rsdb − Rsd)/5.614583, and the oil density by the mass balance down the DL
// (residual oil 5.614583·62.37·γo lbm per bbl plus the gas still dissolved, 0.0764·γg lbm
// per scf at 14.696 psia and 60 °F). Line numbers are those of the CSV files, header on
// line 1.
func inventedQCReport() *Report {
	type st struct{ p, rsd, bod, gg, z float64 }
	stages := []st{
		{2500, 650, 1.3800, 0, 0},
		{2200, 585, 1.3480, 0.780, 0.850},
		{1900, 520, 1.3180, 0.785, 0.860},
		{1600, 455, 1.2890, 0.795, 0.873},
		{1300, 390, 1.2600, 0.810, 0.888},
		{1000, 325, 1.2320, 0.835, 0.906},
		{700, 255, 1.2020, 0.875, 0.927},
		{400, 180, 1.1700, 0.950, 0.952},
		{200, 120, 1.1450, 1.080, 0.973},
		{14.696, 0, 1.0600, 1.300, 0.997},
	}
	round := func(x float64, d int) float64 { s := math.Pow(10, float64(d)); return math.Round(x*s) / s }
	gammaO := 141.5 / (invAPI + 131.5)
	mres := 5.614583 * 62.37 * gammaO
	const rhoAir = 0.0764 // lbm/scf at 14.696 psia and 60 °F (common practice)
	// Gas still dissolved at stage k: the gas liberated at every later stage.
	dissolved := make([]float64, len(stages))
	for k := len(stages) - 2; k >= 0; k-- {
		dissolved[k] = dissolved[k+1] + (stages[k].rsd-stages[k+1].rsd)*rhoAir*stages[k+1].gg
	}
	r := &Report{Fluid: Fluid{
		Sample: "invented-1", Temperature: invT, Pb: invPb, API: invAPI,
		StdPressure: 14.696, StdTemperature: 60, SelectedTest: "1",
		Line: map[string]int{"sample": 2, "reservoir temperature": 3, "saturation pressure": 4,
			"stock-tank API": 5, "selected separator test": 6},
	}}
	for i, s := range stages {
		d := DLStage{Line: i + 2, Pressure: s.p, Rsd: s.rsd, Bod: s.bod, GasGravity: s.gg, Z: s.z,
			OilDensity: round((mres+dissolved[i])/(s.bod*5.614583), 2)}
		if s.z > 0 {
			bg := 14.696 * s.z * (invT + 459.67) / ((60 + 459.67) * s.p)
			d.Bg = round(bg, 6)
			d.Bt = round(s.bod+d.Bg*(stages[0].rsd-s.rsd)/5.614583, 4)
		} else {
			d.Bt = s.bod
		}
		r.DL = append(r.DL, d)
	}
	r.DL = append(r.DL, DLStage{Line: len(stages) + 2, Pressure: 14.696, Residual60: true, Bod: 1,
		OilDensity: round(mres/5.614583, 2)})
	r.Separator = []SeparatorTest{
		{ID: "1", Bofb: 1.300, API: 35.0, Stages: []SeparatorStage{
			{Line: 2, Stage: "1", Pressure: 114.7, Temperature: 75, GOR: 480, GasGravity: 0.740},
			{Line: 3, Stage: "stock tank", Pressure: 14.696, Temperature: 60, GOR: 90, GasGravity: 1.150}}},
		{ID: "2", Bofb: 1.315, API: 34.6, Stages: []SeparatorStage{
			{Line: 4, Stage: "1", Pressure: 300, Temperature: 75, GOR: 430, GasGravity: 0.700},
			{Line: 5, Stage: "stock tank", Pressure: 14.696, Temperature: 60, GOR: 150, GasGravity: 1.200}}},
	}
	r.CCE = syntheticCCE(invYA, invYB, invCoC1, invCoC2, invPb, invPb, cceGrid(invPb), 5)
	// Densities above Pb: constant mass, ρ = ρ(Pb)/(V/Vsat), from the DL first stage.
	for i := range r.CCE {
		if r.CCE[i].Pressure >= invPb {
			r.CCE[i].Density = round(r.DL[0].OilDensity/r.CCE[i].RelVolume, 2)
		}
	}
	return r
}

func hasFinding(fs []Finding, code, file string, row int) bool {
	return slices.ContainsFunc(fs, func(f Finding) bool { return f.Code == code && f.File == file && f.Row == row })
}

func aboveNote(fs []Finding) []Finding {
	var out []Finding
	for _, f := range fs {
		if f.Severity > Note {
			out = append(out, f)
		}
	}
	return out
}

func TestCheckCleanReport(t *testing.T) {
	r := inventedQCReport()
	if r.CCE[invSatIdx].Pressure != invPb || r.CCE[invSatIdx].RelVolume != 1 {
		t.Fatalf("fixture: CCE point %d is %+v, want the saturation point", invSatIdx, r.CCE[invSatIdx])
	}
	fs := Check(r)
	if bad := aboveNote(fs); len(bad) > 0 {
		for _, f := range bad {
			t.Errorf("clean report: %s %s:%d %s: %s", f.Severity, f.File, f.Row, f.Code, f.Message)
		}
	}
	// The notes a clean black oil gets: its class, and the usual clamping of the
	// separator-basis Rs at the atmospheric stage (570 − 650·1.300/1.380 < 0).
	if !hasFinding(fs, "fluid-type", qcFluidFile, 0) || !strings.Contains(fs[0].Message, "black oil") {
		t.Errorf("no black-oil fluid-type note: %+v", fs)
	}
	if !hasFinding(fs, "adjust-rs-clamped", qcDLFile, 11) {
		t.Errorf("no adjust-rs-clamped note at dl.csv line 11: %+v", fs)
	}
	if len(fs) != 2 {
		t.Errorf("clean report: %d findings, want the 2 notes: %+v", len(fs), fs)
	}
}

func TestCheckMutations(t *testing.T) {
	// Each mutation of the invented report must raise the expected finding at the expected
	// file and row, and no finding above note anywhere else.
	tests := []struct {
		name   string
		mutate func(r *Report)
		code   string
		sev    Severity
		file   string
		row    int
	}{
		{"swapped digits in an Rsd (455 → 545)", func(r *Report) { r.DL[3].Rsd = 545 },
			"dl-rs-rising", Error, qcDLFile, 5},
		{"swapped digits in a Bod (1.2600 → 1.2900)", func(r *Report) { r.DL[4].Bod = 1.2900 },
			"dl-bo-rising", Error, qcDLFile, 6},
		{"psig entered as psia in fluid Pb", func(r *Report) { r.Fluid.Pb = invPb - 14.696 },
			"pb-psig-psia", Warning, qcFluidFile, 4},
		{"psia entered as psig in fluid Pb", func(r *Report) { r.Fluid.Pb = invPb + 14.7 },
			"pb-psig-psia", Warning, qcFluidFile, 4},
		{"fluid Pb 3 % off the DL and CCE", func(r *Report) { r.Fluid.Pb = 2575 },
			"pb-dl-mismatch", Warning, qcFluidFile, 4},
		{"fluid Pb 8 % off the DL and CCE", func(r *Report) { r.Fluid.Pb = 2700 },
			"pb-cce-mismatch", Error, qcFluidFile, 4},
		{"dropped atmospheric DL stage", func(r *Report) { r.DL = slices.Delete(r.DL, 9, 10) },
			"dl-last-rs-nonzero", Warning, qcDLFile, 10},
		{"Bofb above Bodb", func(r *Report) { r.Separator[0].Bofb = 1.400 },
			"sep-bofb-above-bodb", Warning, qcSepFile, 3},
		{"CCE volume misread by +0.01", func(r *Report) { r.CCE[12].RelVolume += 0.01 },
			"cce-y-outlier", Warning, qcCCEFile, 14},
		{"CCE volume lower than the one above it", func(r *Report) { r.CCE[10].RelVolume = r.CCE[9].RelVolume - 0.001 },
			"cce-not-monotonic", Error, qcCCEFile, 12},
		{"liberated-gas gravity with swapped digits (0.875 → 0.785)", func(r *Report) { r.DL[6].GasGravity = 0.785 },
			"dl-gas-gravity-falling", Warning, qcDLFile, 8},
		{"Bg reported in rb/scf", func(r *Report) { r.DL[5].Bg /= 5.614583; r.DL[5].Bt = 0 },
			"dl-bg-z-mismatch", Warning, qcDLFile, 7},
		{"Bt with a slipped digit", func(r *Report) { r.DL[2].Bt += 0.1 },
			"dl-bt-mismatch", Warning, qcDLFile, 4},
		{"oil density 2 lbm/ft³ off", func(r *Report) { r.DL[4].OilDensity += 2 },
			"dl-density-mismatch", Warning, qcDLFile, 6},
		{"fluid API not the selected test's", func(r *Report) { r.Fluid.API = 36.0 },
			"sep-api-mismatch", Warning, qcSepFile, 3},
		{"selected separator test missing", func(r *Report) { r.Fluid.SelectedTest = "3" },
			"sep-selected-missing", Error, qcFluidFile, 6},
		{"separator gas gravity below the range", func(r *Report) {
			r.Fluid.SepGasGravity = 0.50
			r.Fluid.Line["separator gas gravity"] = 7
		}, "range-gas-gravity", Warning, qcFluidFile, 7},
		{"CCE density at Pb not the DL's", func(r *Report) { r.CCE[invSatIdx].Density = 46.5 },
			"pb-density-mismatch", Warning, qcCCEFile, 8},
		{"CCE density above Pb with a slipped digit", func(r *Report) { r.CCE[2].Density += 1.5 },
			"cce-density-mismatch", Warning, qcCCEFile, 4},
		{"no separator test", func(r *Report) { r.Separator = nil; r.Fluid.SelectedTest = "" },
			"adjust-no-separator", Warning, qcSepFile, 0},
	}
	base := Check(inventedQCReport())
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			r := inventedQCReport()
			tt.mutate(r)
			fs := Check(r)
			found := false
			for _, f := range fs {
				if f.Code == tt.code && f.File == tt.file && f.Row == tt.row {
					found = true
					if f.Severity != tt.sev {
						t.Errorf("%s at %s:%d is a %s, want %s", tt.code, tt.file, tt.row, f.Severity, tt.sev)
					}
					if f.Message == "" || f.Action == "" {
						t.Errorf("%s: empty message or action: %+v", tt.code, f)
					}
				}
			}
			if !found {
				t.Errorf("no %s at %s:%d; findings:\n%s", tt.code, tt.file, tt.row, dump(fs))
			}
			for _, f := range aboveNote(fs) {
				if (f.File != tt.file || f.Row != tt.row) && !slices.Contains(base, f) {
					t.Errorf("spurious %s %s:%d %s: %s", f.Severity, f.File, f.Row, f.Code, f.Message)
				}
			}
		})
	}
}

func dump(fs []Finding) string {
	var b bytes.Buffer
	_ = FormatFindings(&b, fs)
	return b.String()
}

func TestCheckRanges(t *testing.T) {
	// Range bounds of the brief: API 5–70, gas gravity 0.55–1.8, T 60–400 °F, Rsb 0–5000,
	// Pb 14.7–10000 psia. Each report has only fluid.csv values (no DL consequence checks).
	tests := []struct {
		name  string
		f     Fluid
		code  string
		bound string
	}{
		{"API low", Fluid{API: 4, Temperature: 200, Pb: 2000}, "range-api", "lower bound 5"},
		{"API high", Fluid{API: 71, Temperature: 200, Pb: 2000}, "range-api", "upper bound 70"},
		{"T low", Fluid{API: 35, Temperature: 50, Pb: 2000}, "range-temperature", "lower bound 60"},
		{"T just inside the upper bound", Fluid{API: 35, Temperature: 399, Pb: 2000}, "", ""},
		{"T high", Fluid{API: 35, Temperature: 420, Pb: 2000}, "range-temperature", "upper bound 400"},
		{"Pb high", Fluid{API: 35, Temperature: 200, Pb: 12000}, "range-pb", "upper bound 10000"},
		{"Pb low", Fluid{API: 35, Temperature: 200, Pb: 10}, "range-pb", "lower bound 14.7"},
		{"gas gravity high", Fluid{API: 35, Temperature: 200, Pb: 2000, SepGasGravity: 1.9}, "range-gas-gravity", "upper bound 1.8"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			r := &Report{Fluid: tt.f}
			var got []Finding
			for _, f := range Check(r) {
				if strings.HasPrefix(f.Code, "range-") {
					got = append(got, f)
				}
			}
			if tt.code == "" {
				if len(got) != 0 {
					t.Errorf("in range, got %+v", got)
				}
				return
			}
			if len(got) != 1 || got[0].Code != tt.code || !strings.Contains(got[0].Message, tt.bound) || got[0].Severity != Warning {
				t.Errorf("got %+v, want one %s warning naming the %s", got, tt.code, tt.bound)
			}
		})
	}
	// Rsb above 5000 scf/STB (DL only, no separator test).
	r := &Report{Fluid: Fluid{API: 50, Temperature: 200, Pb: 5000},
		DL: []DLStage{{Line: 2, Pressure: 5000, Rsd: 5200, Bod: 3.1}, {Line: 3, Pressure: 14.696, Bod: 1.1}}}
	fs := Check(r)
	if !hasFinding(fs, "range-rsb", qcDLFile, 2) {
		t.Errorf("Rsdb 5200: no range-rsb at dl.csv:2:\n%s", dump(fs))
	}
	if !hasFinding(fs, "fluid-not-black-oil", qcFluidFile, 0) {
		t.Errorf("Rsdb 5200: no fluid-not-black-oil warning:\n%s", dump(fs))
	}
}

func TestCheckDLAbovePb(t *testing.T) {
	// A DL that starts one stage above the bubble point: no gas liberated, Bod rising.
	r := inventedQCReport()
	r.DL[0].Pressure, r.DL[0].Bod, r.DL[0].Bt = 2600, 1.3790, 1.3790
	r.DL = slices.Insert(r.DL, 1, DLStage{Line: 0, Pressure: 2500, Rsd: 650, Bod: 1.3800, Bt: 1.3800})
	fs := Check(r)
	if !hasFinding(fs, "dl-above-pb", qcDLFile, 2) {
		t.Errorf("no dl-above-pb at dl.csv:2:\n%s", dump(fs))
	}
	if slices.ContainsFunc(fs, func(f Finding) bool { return f.Code == "dl-bo-rising" }) {
		t.Errorf("dl-bo-rising reported for an above-Pb stage:\n%s", dump(fs))
	}
}

func TestCheckYNotStraight(t *testing.T) {
	// A curved Y (invented: Y quadratic in p) gives a note, not a warning.
	r := inventedQCReport()
	for i := range r.CCE {
		p := r.CCE[i].Pressure
		if p < invPb {
			y := 1.0 + 2e-6*(p-1700)*(p-1700)/10 + 4e-4*p
			r.CCE[i].RelVolume = 1 + (invPb-p)/(p*y)
		}
	}
	fs := Check(r)
	if !hasFinding(fs, "cce-y-not-straight", qcCCEFile, 0) {
		t.Errorf("curved Y: no cce-y-not-straight note:\n%s", dump(fs))
	}
}

func TestCheckCCESaturationPoint(t *testing.T) {
	// The CCE normalised at 2500 psia while its straight-Y saturation pressure is 2420
	// (invented, 3.2 % apart): the Y-implied Psat disagrees with the CCE's own.
	r := inventedQCReport()
	r.CCE = syntheticCCE(invYA, invYB, 1.2e-5, 0, 2420, invPb, cceGrid(invPb), 5)
	fs := Check(r)
	if !hasFinding(fs, "cce-y-psat-mismatch", qcCCEFile, 8) {
		t.Errorf("no cce-y-psat-mismatch at cce.csv:8:\n%s", dump(fs))
	}
	// No point with V/Vsat = 1: a note, and the Y-function runs on fluid.csv's Pb.
	r = inventedQCReport()
	r.CCE = slices.Delete(r.CCE, invSatIdx, invSatIdx+1)
	fs = Check(r)
	if !hasFinding(fs, "cce-no-sat-point", qcCCEFile, 0) || len(aboveNote(fs)) != 0 {
		t.Errorf("CCE without its saturation point: want one cce-no-sat-point note and nothing above note:\n%s", dump(fs))
	}
	// Two points below Pb: too few for a Y-function.
	r = inventedQCReport()
	r.CCE = r.CCE[:invSatIdx+3]
	fs = Check(r)
	if !hasFinding(fs, "cce-y-too-few", qcCCEFile, 0) || len(aboveNote(fs)) != 0 {
		t.Errorf("CCE with two two-phase points: want a cce-y-too-few note and nothing above note:\n%s", dump(fs))
	}
}

func TestCheckNilAndEmpty(t *testing.T) {
	if fs := Check(nil); len(fs) != 1 || fs[0].Severity != Error {
		t.Errorf("Check(nil) = %+v", fs)
	}
	fs := Check(&Report{})
	if !hasFinding(fs, "dl-missing", qcDLFile, 0) {
		t.Errorf("empty report: no dl-missing:\n%s", dump(fs))
	}
	// Junk values: no panic, every message free of NaN.
	r := inventedQCReport()
	r.DL[3].Bod = math.NaN()
	r.DL[4].Z = math.Inf(1)
	r.CCE[12].RelVolume = math.NaN()
	r.Fluid.StdPressure, r.Fluid.StdTemperature = 0, 0
	for _, f := range Check(r) {
		if strings.Contains(f.Message, "NaN") && f.Code != "cce-not-monotonic" && f.Code != "dl-bo-rising" {
			t.Errorf("NaN in %s: %s", f.Code, f.Message)
		}
	}
}

func TestCheckNeverPanics(t *testing.T) {
	// Random damage to the invented report (deterministic seed): Check must return, never
	// panic, and every finding must carry a code and a file or be about the whole report.
	rng := rand.New(rand.NewPCG(1, 2))
	junk := []float64{0, -1, math.NaN(), math.Inf(1), math.Inf(-1), 1e300, 1e-300, 14.696, 1}
	pick := func() float64 { return junk[rng.IntN(len(junk))] }
	for i := 0; i < 2000; i++ {
		r := inventedQCReport()
		for k := 0; k < 1+rng.IntN(4); k++ {
			op := rng.IntN(9)
			if len(r.DL) == 0 && op <= 2 {
				op = 5
			}
			switch op {
			case 0:
				r.DL[rng.IntN(len(r.DL))].Pressure = pick()
			case 1:
				r.DL[rng.IntN(len(r.DL))].Rsd = pick()
			case 2:
				r.DL[rng.IntN(len(r.DL))].Bod = pick()
			case 3:
				r.CCE[rng.IntN(len(r.CCE))].RelVolume = pick()
			case 4:
				r.CCE[rng.IntN(len(r.CCE))].Pressure = pick()
			case 5:
				r.Fluid.Pb = pick()
			case 6:
				r.Fluid.API = pick()
			case 7:
				r.Separator[rng.IntN(2)].Bofb = pick()
			case 8:
				r.DL = r.DL[:rng.IntN(len(r.DL)+1)]
			}
		}
		for _, f := range Check(r) {
			if f.Code == "" || f.Message == "" {
				t.Fatalf("finding without code or message: %+v", f)
			}
		}
	}
}

func TestSortFindings(t *testing.T) {
	fs := []Finding{
		{Severity: Note, File: "", Code: "z"},
		{Severity: Warning, File: qcCCEFile, Row: 3, Code: "c"},
		{Severity: Note, File: qcDLFile, Row: 2, Code: "b"},
		{Severity: Error, File: qcDLFile, Row: 9, Code: "a"},
		{Severity: Warning, File: qcDLFile, Row: 4, Code: "d"},
		{Severity: Warning, File: qcDLFile, Row: 3, Code: "e"},
		{Severity: Note, File: qcFluidFile, Code: "f"},
	}
	SortFindings(fs)
	var got []string
	for _, f := range fs {
		got = append(got, f.Code)
	}
	want := []string{"f", "a", "e", "d", "b", "c", "z"}
	if !slices.Equal(got, want) {
		t.Errorf("order %v, want %v (file, then worst first, then row)", got, want)
	}
}

func TestFormatFindings(t *testing.T) {
	w := func(file string, row int) Finding {
		return Finding{Severity: Warning, File: file, Row: row, Code: "w", Message: "m", Action: "a"}
	}
	e := Finding{Severity: Error, File: qcDLFile, Row: 5, Code: "e", Message: "bad", Action: "fix"}
	n := Finding{Severity: Note, File: qcFluidFile, Code: "n", Message: "fyi"}
	tests := []struct {
		name    string
		fs      []Finding
		verdict string
	}{
		{"none", nil, "clean: no errors or warnings"},
		{"notes only", []Finding{n}, "clean: no errors or warnings"},
		{"one warning", []Finding{w(qcDLFile, 2), n}, "1 warning, no errors"},
		{"two warnings", []Finding{w(qcDLFile, 2), w(qcCCEFile, 4)}, "2 warnings, no errors"},
		{"one error", []Finding{e}, "1 error, no warnings: fix the errors before tuning"},
		{"errors and warnings", []Finding{w(qcDLFile, 2), e, w(qcCCEFile, 3), w("", 0), n},
			"1 error, 3 warnings: fix the errors before tuning"},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			var b bytes.Buffer
			if err := FormatFindings(&b, tt.fs); err != nil {
				t.Fatal(err)
			}
			lines := strings.Split(strings.TrimSuffix(b.String(), "\n"), "\n")
			if last := lines[len(lines)-1]; last != tt.verdict {
				t.Errorf("verdict %q, want %q\n%s", last, tt.verdict, b.String())
			}
		})
	}
	var b bytes.Buffer
	_ = FormatFindings(&b, []Finding{w(qcCCEFile, 3), w(qcDLFile, 2), e, n})
	out := b.String()
	iFluid, iDL, iCCE := strings.Index(out, "fluid.csv\n"), strings.Index(out, "dl.csv\n"), strings.Index(out, "cce.csv\n")
	if !(iFluid >= 0 && iFluid < iDL && iDL < iCCE) {
		t.Errorf("files not grouped in report order:\n%s", out)
	}
	if strings.Index(out, "error") > strings.Index(out, "warning  line 2") {
		t.Errorf("error not listed before the warning in dl.csv:\n%s", out)
	}
	if strings.Count(out, "dl.csv\n") != 1 {
		t.Errorf("dl.csv heading repeated:\n%s", out)
	}
}

// A CCE whose volumes above Psat level off (a mistyped last digit at the top) fits a
// compressibility that turns negative: a warning, not a silent negative co (behaviour; the
// volumes are invented).
func TestCheckCCECompressibilityNegative(t *testing.T) {
	r := inventedQCReport()
	var sat CCEPoint
	for _, c := range r.CCE {
		if c.RelVolume == 1 {
			sat = c
		}
	}
	n := 0
	for i := range r.CCE {
		if x := r.CCE[i].Pressure - sat.Pressure; x > 0 {
			// ln V rising again at the top: V = exp(−1e−5·x + 4e−9·x²).
			r.CCE[i].RelVolume = math.Exp(-1e-5*x + 4e-9*x*x)
			n++
		}
	}
	if n < 2 {
		t.Fatalf("%d CCE points above Psat", n)
	}
	fs := Check(r)
	if !hasFinding(fs, "cce-co-negative", qcCCEFile, sat.Line) {
		t.Errorf("no cce-co-negative warning:\n%s", dump(fs))
	}
	if hasFinding(Check(inventedQCReport()), "cce-co-negative", qcCCEFile, sat.Line) {
		t.Error("cce-co-negative on the clean report")
	}
}

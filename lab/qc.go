package lab

import (
	"errors"
	"fmt"
	"io"
	"math"
	"sort"
	"strings"

	"labmatch/correlations"
)

// Tolerances and thresholds of the QC checks. Each is a documented choice; the source or
// reasoning is beside it.
const (
	// Bt = Bod + Bg·(Rsdb − Rsd)/5.614583 and Bg = psc·Z·T/(Tsc·p) are identities of the DL
	// (McCain, The Properties of Petroleum Fluids, 2nd ed., ch. 10); 1 % covers the rounding
	// of printed reports.
	qcBtTol = 0.01
	qcBgTol = 0.01
	// The DL mass balance neglects the difference between residual-oil and stock-tank
	// gravity and rounds the air density; 2 % covers that.
	qcDensityTol = 0.02
	// Stock-tank API of the selected separator test against fluid.csv (°API).
	qcAPITol = 0.5
	// Agreement of the saturation pressures of fluid.csv, the DL first stage and the CCE
	// point with V/Vsat = 1: above 0.5 % a note, above 2 % a warning, above 5 % an error.
	// A difference of one atmosphere (14.696 psi ± qcPsigBand) is reported as a likely
	// psig/psia slip whatever its size in per cent.
	qcPbNoteFrac = 0.005
	qcPbWarnFrac = 0.02
	qcPbErrFrac  = 0.05
	qcPsigBand   = 1.5 // psi
	// The Y-implied saturation pressure against the CCE's own (2 %: a warning).
	qcYPsatFrac = 0.02
	// A Y line with r² below this is "not straight" (a note).
	qcYR2Min = 0.98
	// Liberated-gas gravity should rise as pressure falls; published DLs often dip slightly
	// at the first stages (from memory), so only a fall larger than this is reported.
	qcGasGravityDrop = 0.03
	// Rsd at the last (atmospheric) stage should be 0; the rounding allowance, scf/bbl.
	qcLastRsTol = 0.5
	// A CCE relative volume within this of 1 marks the saturation point (4 printed decimals).
	qcSatRelTol = 5e-5
)

// Constants of the trade used by the checks.
const (
	qcAtm          = 14.696                     // psia, one standard atmosphere (common practice)
	qcFt3PerBbl    = 5.614583                   // ft³ per bbl, exact by definition (42 US gal)
	qcWaterDensity = 62.37                      // lbm/ft³ at 60 °F (common practice; 62.4 rounded)
	qcAirMolarMass = 28.97                      // lbm/lb-mol (AAPG Wiki, "Petroleum reservoir fluid properties")
	qcGasConstant  = 10.7316                    // psia·ft³/(lb-mol·°R) (common practice; 10.73 in Lyons, ed.)
	qcRankine      = correlations.RankineOffset // °F to °R
)

// Range limits of the plausibility checks (DESIGN: the ranges of the published black-oil
// correlations' data sets, rounded outward).
const (
	qcMinAPI, qcMaxAPI         = 5.0, 70.0
	qcMinGasGrav, qcMaxGasGrav = 0.55, 1.8
	qcMinTemp, qcMaxTemp       = 60.0, 400.0
	qcMinRsb, qcMaxRsb         = 0.0, 5000.0
	qcMinPb, qcMaxPb           = 14.7, 10000.0
)

// Report file names as findings name them.
const (
	qcFluidFile = "fluid.csv"
	qcDLFile    = "dl.csv"
	qcSepFile   = "separator.csv"
	qcCCEFile   = "cce.csv"
	qcViscFile  = "viscosity.csv"
)

// Check examines a report for consistency and plausibility and returns its findings, sorted
// by SortFindings. Codes (severity):
//
//	range-api, range-gas-gravity, range-temperature, range-rsb, range-pb (warning)
//	fluid-type (note), fluid-not-black-oil (warning)
//	dl-missing, dl-pressure-order, dl-rs-rising, dl-bo-rising (error)
//	dl-above-pb, dl-last-rs-nonzero, dl-gas-gravity-falling, dl-bt-mismatch,
//	dl-bg-z-mismatch, dl-density-mismatch (warning)
//	sep-selected-missing, sep-bofb-above-bodb, sep-gor-negative (error)
//	sep-no-bofb, sep-api-mismatch (warning)
//	pb-psig-psia (warning); pb-dl-mismatch, pb-cce-mismatch (note, warning or error)
//	cce-not-monotonic (error); cce-y-outlier, cce-y-psat-mismatch, cce-density-mismatch,
//	pb-density-mismatch (warning)
//	cce-no-sat-point, cce-y-too-few, cce-y-not-straight (note)
//	adjust-no-separator (warning), adjust-rs-clamped (note)
//	report-missing (error: a nil report)
//
// The separator stage GORs are not checked against a total: the report format has no
// total-GOR column (Rsfb is the sum of the stages by definition).
func Check(r *Report) []Finding {
	if r == nil {
		return []Finding{{Severity: Error, Code: "report-missing", Message: "no report to check",
			Action: "load a report folder first"}}
	}
	q := qcReport{r: r}
	q.prepare()
	q.ranges()
	q.fluidType()
	q.dl()
	q.separator()
	q.pb()
	q.cce()
	q.adjust()
	SortFindings(q.fs)
	return q.fs
}

// SortFindings orders findings by file (fluid.csv, dl.csv, separator.csv, cce.csv,
// viscosity.csv, any other file by name, then whole-report findings), then severity worst
// first, then row, then code.
func SortFindings(fs []Finding) {
	sort.SliceStable(fs, func(i, j int) bool {
		a, b := fs[i], fs[j]
		if ra, rb := qcFileRank(a.File), qcFileRank(b.File); ra != rb {
			return ra < rb
		}
		if a.File != b.File {
			return a.File < b.File
		}
		if a.Severity != b.Severity {
			return a.Severity > b.Severity
		}
		if a.Row != b.Row {
			return a.Row < b.Row
		}
		return a.Code < b.Code
	})
}

func qcFileRank(f string) int {
	switch f {
	case qcFluidFile:
		return 0
	case qcDLFile:
		return 1
	case qcSepFile:
		return 2
	case qcCCEFile:
		return 3
	case qcViscFile:
		return 4
	case "":
		return 6
	}
	return 5
}

// FormatFindings writes findings grouped by file, worst first, each with its row, code,
// message and action, then a one-line verdict.
func FormatFindings(w io.Writer, fs []Finding) error {
	sorted := append([]Finding(nil), fs...)
	SortFindings(sorted)
	var b strings.Builder
	file := "\x00"
	for _, f := range sorted {
		if f.File != file {
			file = f.File
			name := file
			if name == "" {
				name = "whole report"
			}
			b.WriteString(name + "\n")
		}
		row := "-"
		if f.Row > 0 {
			row = fmt.Sprintf("line %d", f.Row)
		}
		fmt.Fprintf(&b, "  %-7s  %-8s  %s: %s\n", f.Severity, row, f.Code, f.Message)
		if f.Action != "" {
			fmt.Fprintf(&b, "  %-7s  %-8s  → %s\n", "", "", f.Action)
		}
	}
	b.WriteString(Verdict(fs) + "\n")
	_, err := io.WriteString(w, b.String())
	return err
}

// Verdict sums findings up in one line: "clean: no errors or warnings", "2 warnings, no
// errors", "1 error, 3 warnings: fix the errors before tuning".
func Verdict(fs []Finding) string {
	var ne, nw int
	for _, f := range fs {
		switch f.Severity {
		case Error:
			ne++
		case Warning:
			nw++
		}
	}
	plural := func(n int, word string) string {
		if n == 0 {
			return "no " + word + "s"
		}
		if n == 1 {
			return "1 " + word
		}
		return fmt.Sprintf("%d %ss", n, word)
	}
	switch {
	case ne == 0 && nw == 0:
		return "clean: no errors or warnings"
	case ne == 0:
		return plural(nw, "warning") + ", no errors"
	}
	return plural(ne, "error") + ", " + plural(nw, "warning") + ": fix the errors before tuning"
}

// qcReport carries one Check run.
type qcReport struct {
	r        *Report
	fs       []Finding
	stages   []int   // indices of the DL stages at reservoir temperature, in file order
	psc, tsc float64 // standard pressure, psia, and temperature, °F
	pbLine   int     // fluid.csv line of the saturation pressure
}

func (q *qcReport) add(sev Severity, file string, row int, code, action, format string, args ...any) {
	q.fs = append(q.fs, Finding{Severity: sev, File: file, Row: row, Code: code,
		Message: fmt.Sprintf(format, args...), Action: action})
}

func (q *qcReport) prepare() {
	for i, st := range q.r.DL {
		if !st.Residual60 {
			q.stages = append(q.stages, i)
		}
	}
	q.psc, q.tsc = q.r.Fluid.StdPressure, q.r.Fluid.StdTemperature
	if !(q.psc > 0) {
		q.psc = qcAtm
	}
	if q.tsc == 0 || q.tsc+qcRankine <= 0 {
		q.tsc = 60
	}
	q.pbLine = q.fluidLine("saturation pressure", "bubble point", "bubble-point pressure", "Pb", "Psat")
}

// fluidLine returns the fluid.csv line of the first of keys that the report gives
// (case-insensitive), or 0.
func (q *qcReport) fluidLine(keys ...string) int {
	for _, k := range keys {
		for name, line := range q.r.Fluid.Line {
			if strings.EqualFold(strings.TrimSpace(name), k) {
				return line
			}
		}
	}
	return 0
}

// bubbleStage returns the DL stage taken as the bubble point, ok false when the DL is empty.
func (q *qcReport) bubbleStage() (DLStage, bool) {
	if len(q.stages) == 0 {
		return DLStage{}, false
	}
	return q.r.DL[q.stages[0]], true
}

// rsb returns the solution GOR at the bubble point for classification and range checks:
// the selected separator test's Rsfb (scf/STB) or else the DL's Rsdb (scf/bbl of residual
// oil), with the file and row it comes from.
func (q *qcReport) rsb() (v float64, what, file string, row int) {
	if t, ok := q.r.SelectedSeparator(); ok && t.Rsfb() > 0 {
		return t.Rsfb(), "Rsfb of separator test " + t.ID, qcSepFile, qcStockTankLine(t)
	}
	if b, ok := q.bubbleStage(); ok {
		return b.Rsd, "DL Rsdb", qcDLFile, b.Line
	}
	return 0, "", "", 0
}

func qcStockTankLine(t SeparatorTest) int {
	if len(t.Stages) == 0 {
		return 0
	}
	return t.Stages[len(t.Stages)-1].Line
}

func qcRelDiff(a, b float64) float64 {
	if b == 0 {
		return math.Inf(1)
	}
	return math.Abs(a-b) / math.Abs(b)
}

// rangeCheck reports v outside [lo, hi], naming the bound crossed.
func (q *qcReport) rangeCheck(code, what, unit string, v, lo, hi float64, file string, row int, action string) {
	switch {
	case v < lo || (code == "range-rsb" && v <= lo):
		q.add(Warning, file, row, code, action, "%s %.4g %s is at or below the lower bound %g %s", what, v, unit, lo, unit)
	case v > hi:
		q.add(Warning, file, row, code, action, "%s %.4g %s is above the upper bound %g %s", what, v, unit, hi, unit)
	case math.IsNaN(v):
		q.add(Warning, file, row, code, action, "%s is not a number", what)
	}
}

func (q *qcReport) ranges() {
	f := q.r.Fluid
	q.rangeCheck("range-api", "stock-tank gravity", "°API", f.API, qcMinAPI, qcMaxAPI,
		qcFluidFile, q.fluidLine("stock-tank API", "API", "residual oil gravity"),
		"check the unit (°API or specific gravity) and the value; outside 5–70 °API the correlations do not apply")
	if g := q.r.GasGravity(); g > 0 {
		file, row := qcFluidFile, q.fluidLine("separator gas gravity", "gas gravity")
		if f.SepGasGravity <= 0 {
			file, row = qcSepFile, 0
			if t, ok := q.r.SelectedSeparator(); ok {
				row = qcStockTankLine(t)
			}
		}
		q.rangeCheck("range-gas-gravity", "separator gas gravity", "(air = 1)", g, qcMinGasGrav, qcMaxGasGrav,
			file, row, "check the gas gravity (air = 1); outside 0.55–1.8 the gas correlations do not apply")
	}
	q.rangeCheck("range-temperature", "reservoir temperature", "°F", f.Temperature, qcMinTemp, qcMaxTemp,
		qcFluidFile, q.fluidLine("reservoir temperature", "temperature"),
		"check the temperature unit ([degF], [degC] or [K]) and the value")
	if v, what, file, row := q.rsb(); what != "" {
		q.rangeCheck("range-rsb", what, "scf/STB", v, qcMinRsb, qcMaxRsb, file, row,
			"check the GOR unit ([scf/STB] or [sm3/sm3]); above 5000 scf/STB the fluid is not a black oil")
	}
	q.rangeCheck("range-pb", "saturation pressure", "psia", f.Pb, qcMinPb, qcMaxPb, qcFluidFile, q.pbLine,
		"check the pressure unit ([psia], [psig], [bara], [MPa]…) and the value")
}

func (q *qcReport) fluidType() {
	rsb, _, _, _ := q.rsb()
	if rsb <= 0 {
		return
	}
	bob := 0.0
	if t, ok := q.r.SelectedSeparator(); ok && t.Bofb > 0 && t.Rsfb() > 0 {
		bob = t.Bofb
	} else if b, ok := q.bubbleStage(); ok {
		bob = b.Bod
	}
	api := q.r.Fluid.API
	if t, ok := q.r.SelectedSeparator(); ok && t.API > 0 && api <= 0 {
		api = t.API
	}
	ft, why := Classify(rsb, api, bob)
	q.add(Note, qcFluidFile, 0, "fluid-type", "", "%s", why)
	if ft == VolatileOil || ft == GasCondensate {
		q.add(Warning, qcFluidFile, 0, "fluid-not-black-oil",
			"black-oil correlations are a poor choice for this fluid; prefer an equation-of-state or modified black-oil model, and treat tuned results with caution",
			"the fluid looks like a %s, not a black oil", ft)
	}
}

func (q *qcReport) dl() {
	r := q.r
	if len(q.stages) == 0 {
		q.add(Error, qcDLFile, 0, "dl-missing", "add the differential-liberation stages to dl.csv",
			"dl.csv has no stages at reservoir temperature")
		return
	}
	for k := 1; k < len(q.stages); k++ {
		a, b := r.DL[q.stages[k-1]], r.DL[q.stages[k]]
		if b.Pressure >= a.Pressure {
			q.add(Error, qcDLFile, b.Line, "dl-pressure-order", "list the DL stages from the highest pressure down",
				"stage pressure %.6g psia does not fall below the previous stage's %.6g psia (line %d)", b.Pressure, a.Pressure, a.Line)
			continue
		}
		if b.Rsd > a.Rsd {
			q.add(Error, qcDLFile, b.Line, "dl-rs-rising", "check this Rsd for a mistyped or swapped digit",
				"Rsd rises from %.6g to %.6g scf/bbl as pressure falls from %.6g to %.6g psia", a.Rsd, b.Rsd, a.Pressure, b.Pressure)
		}
		if b.Bod > a.Bod {
			if k == 1 && b.Rsd == a.Rsd {
				q.add(Warning, qcDLFile, a.Line, "dl-above-pb", "start dl.csv at the bubble point; give the undersaturated volumes in cce.csv",
					"no gas is liberated between %.6g and %.6g psia and Bod rises from %.5g to %.5g: the first stage lies above the bubble point",
					a.Pressure, b.Pressure, a.Bod, b.Bod)
			} else {
				q.add(Error, qcDLFile, b.Line, "dl-bo-rising", "check this Bod for a mistyped or swapped digit",
					"Bod rises from %.5g to %.5g as pressure falls from %.6g to %.6g psia", a.Bod, b.Bod, a.Pressure, b.Pressure)
			}
		}
	}
	last := r.DL[q.stages[len(q.stages)-1]]
	if len(q.stages) > 1 && math.Abs(last.Rsd) > qcLastRsTol {
		q.add(Warning, qcDLFile, last.Line, "dl-last-rs-nonzero", "add the final atmospheric stage (Rsd = 0), or check for a dropped row",
			"the last DL stage (%.6g psia) has Rsd = %.6g scf/bbl; the residual oil at atmospheric pressure holds no gas", last.Pressure, last.Rsd)
	}
	// Liberated-gas gravity should rise as pressure falls.
	prev := -1
	for _, i := range q.stages {
		st := r.DL[i]
		if st.GasGravity <= 0 {
			continue
		}
		if prev >= 0 && st.GasGravity < r.DL[prev].GasGravity-qcGasGravityDrop {
			q.add(Warning, qcDLFile, st.Line, "dl-gas-gravity-falling", "check the gas gravity for a mistyped digit",
				"liberated-gas gravity falls from %.4g to %.4g as pressure falls from %.6g to %.6g psia; heavier gas should come off at lower pressure",
				r.DL[prev].GasGravity, st.GasGravity, r.DL[prev].Pressure, st.Pressure)
		}
		prev = i
	}
	q.dlGas()
	q.dlDensity()
}

// bgFromZ returns Bg = psc·Z·T/(Tsc·p), rcf/scf, at the DL temperature (real-gas law;
// common practice), or 0 when it cannot be computed.
func (q *qcReport) bgFromZ(z, p float64) float64 {
	t := q.r.Fluid.Temperature + qcRankine
	if !(z > 0) || !(p > 0) || !(t > 0) {
		return 0
	}
	return q.psc * z * t / ((q.tsc + qcRankine) * p)
}

func (q *qcReport) dlGas() {
	r := q.r
	b, _ := q.bubbleStage()
	for _, i := range q.stages {
		st := r.DL[i]
		bgz := q.bgFromZ(st.Z, st.Pressure)
		if st.Bg > 0 && bgz > 0 && qcRelDiff(st.Bg, bgz) > qcBgTol {
			hint := ""
			if qcRelDiff(st.Bg*qcFt3PerBbl, bgz) < 0.02 {
				hint = " (the reported Bg is Bg(Z)/5.6146: rb/scf reported as rcf/scf?)"
			}
			q.add(Warning, qcDLFile, st.Line, "dl-bg-z-mismatch", "check Bg, Z and the Bg unit ([rcf/scf] vs [rb/scf]) at this stage",
				"Bg %.5g rcf/scf disagrees with Z = %.4g at %.6g psia and %.4g °F, which gives %.5g (%.1f %%)%s",
				st.Bg, st.Z, st.Pressure, r.Fluid.Temperature, bgz, 100*qcRelDiff(st.Bg, bgz), hint)
		}
		if st.Bt <= 0 {
			continue
		}
		bg := st.Bg
		if bg <= 0 {
			bg = bgz
		}
		if bg <= 0 && st.Rsd != b.Rsd {
			continue
		}
		bt := st.Bod + bg*(b.Rsd-st.Rsd)/qcFt3PerBbl
		if qcRelDiff(st.Bt, bt) > qcBtTol {
			q.add(Warning, qcDLFile, st.Line, "dl-bt-mismatch", "check Bt, Bod, Rsd and Bg at this stage",
				"Bt %.5g disagrees with Bod + Bg·(Rsdb − Rsd)/5.614583 = %.5g + %.5g·(%.6g − %.6g)/5.614583 = %.5g (%.1f %%)",
				st.Bt, st.Bod, bg, b.Rsd, st.Rsd, bt, 100*qcRelDiff(st.Bt, bt))
		}
	}
}

// dlDensity checks the reported oil densities with a mass balance down the DL: the residual
// oil weighs 5.614583·62.37·γo lbm per bbl; the oil at a stage also holds the gas liberated
// at every later stage, (Rsd_{j−1} − Rsd_j)·ρair·γg_j lbm; the density is that mass over
// Bod·5.614583 ft³ (McCain, The Properties of Petroleum Fluids, 2nd ed., ch. 10). It needs
// the atmospheric stage (Rsd = 0) and the gas gravity of every later stage.
func (q *qcReport) dlDensity() {
	r := q.r
	if !(r.Fluid.API > -131.5) || r.Fluid.API <= 0 {
		return
	}
	last := r.DL[q.stages[len(q.stages)-1]]
	if math.Abs(last.Rsd) > qcLastRsTol {
		return
	}
	api := r.Fluid.API
	if r.Fluid.ResidualAPI > 0 { // the DL's own residual oil, lighter or heavier than the stock tank's
		api = r.Fluid.ResidualAPI
	}
	gammaO := 141.5 / (api + 131.5)
	mres := qcFt3PerBbl * qcWaterDensity * gammaO
	rhoAir := qcAirMolarMass * q.psc / (qcGasConstant * (q.tsc + qcRankine))
	check := func(st DLStage, mass float64) {
		if st.OilDensity <= 0 || st.Bod <= 0 {
			return
		}
		rho := mass / (st.Bod * qcFt3PerBbl)
		if qcRelDiff(st.OilDensity, rho) > qcDensityTol {
			q.add(Warning, qcDLFile, st.Line, "dl-density-mismatch", "check the oil density, Bod, Rsd and gas gravities of this and the later stages",
				"oil density %.4g lbm/ft³ disagrees with the DL mass balance, %.4g lbm/ft³ (%.1f %%)",
				st.OilDensity, rho, 100*qcRelDiff(st.OilDensity, rho))
		}
	}
	gas, known := 0.0, true
	for k := len(q.stages) - 1; k >= 0; k-- {
		st := r.DL[q.stages[k]]
		if known {
			check(st, mres+gas)
		}
		if k == 0 {
			break
		}
		lib := r.DL[q.stages[k-1]].Rsd - st.Rsd
		if lib > 0 {
			if st.GasGravity <= 0 && known {
				known = false
				q.add(Note, qcDLFile, st.Line, "dl-density-unchecked", "give the gravity of the gas liberated at this stage",
					"no gas gravity at %.6g psia: the oil densities at this and higher pressures are not checked by mass balance (no gravity is assumed)", st.Pressure)
			}
			gas += lib * rhoAir * st.GasGravity
		}
	}
	for _, st := range r.DL {
		if st.Residual60 {
			check(st, mres)
		}
	}
}

func (q *qcReport) separator() {
	r := q.r
	if sel := r.Fluid.SelectedTest; sel != "" {
		found := false
		for _, t := range r.Separator {
			found = found || t.ID == sel
		}
		if !found {
			ids := make([]string, len(r.Separator))
			for i, t := range r.Separator {
				ids[i] = t.ID
			}
			q.add(Error, qcFluidFile, q.fluidLine("selected separator test"), "sep-selected-missing",
				"name one of the tests in separator.csv, or remove the key to use the test with the smallest Bofb",
				"selected separator test %q is not in separator.csv (tests: %s)", sel, strings.Join(ids, ", "))
		}
	}
	b, haveDL := q.bubbleStage()
	sel, haveSel := r.SelectedSeparator()
	for _, t := range r.Separator {
		row := qcStockTankLine(t)
		for _, st := range t.Stages {
			if st.GOR < 0 {
				q.add(Error, qcSepFile, st.Line, "sep-gor-negative", "check the GOR of this stage",
					"test %s stage %s has a negative GOR, %.6g scf/STB", t.ID, st.Stage, st.GOR)
			}
		}
		if t.Bofb <= 0 {
			q.add(Warning, qcSepFile, row, "sep-no-bofb", "give Bofb on the stock-tank row of the test",
				"separator test %s has no Bofb: it cannot be used to adjust the DL", t.ID)
			continue
		}
		// A multi-stage flash usually leaves more stock-tank oil and less gas than the DL:
		// Bofb < Bodb and Rsfb < Rsdb (common practice). A single-stage or hot flash can break
		// it, so these are warnings.
		if haveDL && b.Bod > 0 && t.Bofb >= b.Bod {
			q.add(Warning, qcSepFile, row, "sep-bofb-above-bodb", "check Bofb of this test and Bod of the DL's first stage",
				"separator test %s has Bofb %.5g ≥ Bodb %.5g (dl.csv line %d); the flash usually yields more stock-tank oil than the DL, so Bofb should be smaller",
				t.ID, t.Bofb, b.Bod, b.Line)
		}
		if rsfb := t.Rsfb(); haveDL && b.Rsd > 0 && rsfb >= b.Rsd {
			q.add(Warning, qcSepFile, row, "sep-rsfb-above-rsdb", "check that the stage GORs are per STB of stock-tank oil, not per barrel of separator oil",
				"separator test %s has Rsfb %.5g ≥ Rsdb %.5g scf/bbl (dl.csv line %d); the flash usually liberates less gas than the DL",
				t.ID, rsfb, b.Rsd, b.Line)
		}
		if haveSel && t.ID == sel.ID && t.API > 0 && r.Fluid.API > 0 && math.Abs(t.API-r.Fluid.API) > qcAPITol {
			q.add(Warning, qcSepFile, row, "sep-api-mismatch", "use the selected test's stock-tank API in fluid.csv, or select the test it belongs to",
				"selected test %s gives %.4g °API; fluid.csv gives %.4g °API (difference %.2g > %.1g)",
				t.ID, t.API, r.Fluid.API, math.Abs(t.API-r.Fluid.API), qcAPITol)
		}
	}
}

// cceSatPoint returns the CCE point with V/Vsat = 1 nearest the report's Pb.
func (q *qcReport) cceSatPoint() (CCEPoint, bool) {
	var best CCEPoint
	ok := false
	for _, c := range q.r.CCE {
		if math.Abs(c.RelVolume-1) <= qcSatRelTol &&
			(!ok || math.Abs(c.Pressure-q.r.Fluid.Pb) < math.Abs(best.Pressure-q.r.Fluid.Pb)) {
			best, ok = c, true
		}
	}
	return best, ok
}

// pb compares the saturation pressure of fluid.csv with the DL's first stage and the CCE's
// point with V/Vsat = 1. A difference of one atmosphere is reported once, as a likely
// psig/psia slip; other differences are graded by qcPbNoteFrac, qcPbWarnFrac, qcPbErrFrac.
func (q *qcReport) pb() {
	pb := q.r.Fluid.Pb
	if !(pb > 0) {
		return
	}
	type source struct {
		code, what, file string
		line             int
		p                float64
	}
	var src []source
	if b, ok := q.bubbleStage(); ok && b.Pressure > 0 {
		src = append(src, source{"pb-dl-mismatch", "the DL first stage", qcDLFile, b.Line, b.Pressure})
	}
	if c, ok := q.cceSatPoint(); ok && c.Pressure > 0 {
		src = append(src, source{"pb-cce-mismatch", "the CCE point with V/Vsat = 1", qcCCEFile, c.Line, c.Pressure})
	}
	var slips []string
	for _, s := range src {
		d := pb - s.p
		where := fmt.Sprintf("%s (%.6g psia, %s line %d)", s.what, s.p, s.file, s.line)
		if math.Abs(math.Abs(d)-qcAtm) <= qcPsigBand {
			dir := "above"
			if d < 0 {
				dir = "below"
			}
			slips = append(slips, fmt.Sprintf("%.1f psi %s %s", math.Abs(d), dir, where))
			continue
		}
		rel := math.Abs(d) / s.p
		var sev Severity
		switch {
		case rel > qcPbErrFrac:
			sev = Error
		case rel > qcPbWarnFrac:
			sev = Warning
		case rel > qcPbNoteFrac:
			sev = Note
		default:
			continue
		}
		q.add(sev, qcFluidFile, q.pbLine, s.code, "check which saturation pressure is right; the oil at Pb has one pressure, one Bo and one Rs",
			"saturation pressure %.6g psia differs from %s by %.3g %%", pb, where, 100*rel)
	}
	if len(slips) > 0 {
		q.add(Warning, qcFluidFile, q.pbLine, "pb-psig-psia", "check the pressure units of the headers ([psig] vs [psia]); gauge pressures need the [psig] unit",
			"saturation pressure %.6g psia is %s: one atmosphere apart, a psig value entered as psia?", pb, strings.Join(slips, "; "))
	}
}

func (q *qcReport) cce() {
	r := q.r
	if len(r.CCE) == 0 {
		return
	}
	sorted := append([]CCEPoint(nil), r.CCE...)
	sort.SliceStable(sorted, func(i, j int) bool { return sorted[i].Pressure > sorted[j].Pressure })
	for i := 1; i < len(sorted); i++ {
		a, b := sorted[i-1], sorted[i]
		switch {
		case b.Pressure == a.Pressure:
			q.add(Error, qcCCEFile, b.Line, "cce-not-monotonic", "remove the duplicate or correct its pressure",
				"two CCE points at %.6g psia (lines %d and %d)", b.Pressure, a.Line, b.Line)
		case b.RelVolume <= a.RelVolume:
			q.add(Error, qcCCEFile, b.Line, "cce-not-monotonic", "check this relative volume for a mistyped digit",
				"V/Vsat %.6g at %.6g psia is not above %.6g at %.6g psia (line %d): the volume must grow as pressure falls",
				b.RelVolume, b.Pressure, a.RelVolume, a.Pressure, a.Line)
		}
	}
	psat := r.Fluid.Pb
	satLine := 0
	if c, ok := q.cceSatPoint(); ok {
		psat, satLine = c.Pressure, c.Line
		q.cceDensity(c)
	} else {
		q.add(Note, qcCCEFile, 0, "cce-no-sat-point", "give the saturation point (V/Vsat = 1) in cce.csv",
			"no CCE point has V/Vsat = 1; the Y-function uses fluid.csv's saturation pressure, %.6g psia", psat)
	}
	if !(psat > 0) {
		return
	}
	if _, cf, err := UndersaturatedCo(psat, r.CCE); err == nil {
		for _, p := range []float64{psat, cf.Pmax} {
			if co := cf.Co(p); !(co > 0) {
				q.add(Warning, qcCCEFile, satLine, "cce-co-negative", "check the relative volumes above the saturation pressure for a mistyped digit",
					"the compressibility fitted to the CCE above Psat is %.3g 1/psi at %.6g psia: an oil cannot expand as pressure rises", co, p)
				break
			}
		}
	}
	fit, err := FitY(psat, r.CCE)
	if err != nil {
		if errors.Is(err, ErrYTooFewPoints) {
			q.add(Note, qcCCEFile, 0, "cce-y-too-few", "", "fewer than 3 CCE points below %.6g psia: no Y-function check", psat)
		}
		return
	}
	for _, pt := range fit.Points {
		if pt.Outlier {
			q.add(Warning, qcCCEFile, pt.Line, "cce-y-outlier", "check this relative volume; exclude the point from tuning if it cannot be confirmed",
				"at %.6g psia, V/Vsat %.6g gives Y = %.4g, off the Y line (%.4g) by %.1f %% (studentised residual %.3g)",
				pt.Pressure, pt.RelVolume, pt.Y, pt.Fit, 100*qcRelDiff(pt.Y, pt.Fit), pt.T)
		}
	}
	if fit.R2 < qcYR2Min {
		q.add(Note, qcCCEFile, 0, "cce-y-not-straight", "check the saturation pressure and the volumes near it; a curved Y may also mean the fluid is not a black oil",
			"the Y-function is not straight: r² = %.4f < %.2f for Y = %.4g + %.4g·p", fit.R2, qcYR2Min, fit.A, fit.B)
	}
	est, err := ImpliedPsat(psat, r.CCE)
	if err == nil && qcRelDiff(est.Psat, psat) > qcYPsatFrac {
		q.add(Warning, qcCCEFile, satLine, "cce-y-psat-mismatch", "check the saturation pressure the CCE volumes are normalised at",
			"the Y-function is straightest with Psat = %.6g psia, %.3g %% from the CCE's %.6g psia",
			est.Psat, 100*qcRelDiff(est.Psat, psat), psat)
	}
}

// cceDensity checks the CCE densities: the oil at Pb is one oil, so the CCE density at the
// saturation point equals the DL's first-stage density; and a constant mass means
// ρ(p)·(V/Vsat) is the same at every point at and above Pb. That product is anchored on its
// median (with three or more points) so that one wrong density is the one reported. Both
// within qcDensityTol.
func (q *qcReport) cceDensity(sat CCEPoint) {
	if b, ok := q.bubbleStage(); ok && sat.Density > 0 && b.OilDensity > 0 && qcRelDiff(sat.Density, b.OilDensity) > qcDensityTol {
		q.add(Warning, qcCCEFile, sat.Line, "pb-density-mismatch", "check both densities; the oil at the bubble point has one density",
			"CCE density at the saturation point, %.4g lbm/ft³, differs from the DL first stage's %.4g (dl.csv line %d) by %.1f %%",
			sat.Density, b.OilDensity, b.Line, 100*qcRelDiff(sat.Density, b.OilDensity))
	}
	var pts []CCEPoint
	var prod []float64
	for _, c := range q.r.CCE {
		if c.Density > 0 && c.RelVolume > 0 && c.Pressure >= sat.Pressure {
			pts = append(pts, c)
			prod = append(prod, c.Density*c.RelVolume)
		}
	}
	if len(pts) < 2 {
		return
	}
	anchor := sat.Density
	if len(prod) >= 3 || anchor <= 0 {
		sorted := append([]float64(nil), prod...)
		sort.Float64s(sorted)
		n := len(sorted)
		anchor = (sorted[(n-1)/2] + sorted[n/2]) / 2
	}
	for i, c := range pts {
		if qcRelDiff(prod[i], anchor) > qcDensityTol {
			q.add(Warning, qcCCEFile, c.Line, "cce-density-mismatch", "check the density and the relative volume of this point",
				"density %.4g lbm/ft³ at %.6g psia times V/Vsat %.6g is %.4g; the other points give %.4g (%.1f %% apart): the mass is not constant",
				c.Density, c.Pressure, c.RelVolume, prod[i], anchor, 100*qcRelDiff(prod[i], anchor))
		}
	}
}

func (q *qcReport) adjust() {
	r := q.r
	if len(q.stages) == 0 {
		return
	}
	s, err := r.SeparatorBasis()
	if err != nil {
		if errors.Is(err, ErrNoSeparator) {
			q.add(Warning, qcSepFile, 0, "adjust-no-separator", "add a separator test (separator.csv) so the DL can be put on separator basis",
				"no usable separator test: DL data cannot be converted to separator conditions, and DL-basis Rs and Bo overstate the field values")
		}
		return
	}
	var rows []string
	first := 0
	for _, p := range s.Below {
		if p.Clamped {
			if first == 0 {
				first = p.Line
			}
			if p.Line > 0 {
				rows = append(rows, fmt.Sprintf("line %d (%.6g psia)", p.Line, p.Pressure))
			} else {
				rows = append(rows, fmt.Sprintf("%.6g psia", p.Pressure))
			}
		}
	}
	if len(rows) > 0 {
		q.add(Note, qcDLFile, first, "adjust-rs-clamped", "usual at low pressure; tuning leaves these stages out of Rs and Bo",
			"separator-basis Rs = Rsfb − (Rsdb − Rsd)·Bofb/Bodb came out below zero and was set to zero at %s", strings.Join(rows, ", "))
	}
}

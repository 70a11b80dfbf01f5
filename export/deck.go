package export

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"

	"labmatch/lab"
)

// deckDigits is the number of significant digits of the deck's numbers. The simulator rules
// are checked on the numbers as written, so rounding cannot break them unseen.
const deckDigits = 7

// ErrRule means a table breaks a rule that the simulator enforces; the error is a *RuleError
// naming the row.
var ErrRule = errors.New("export: deck: the tuned model breaks a rule the simulator enforces")

// RuleError names the deck row where a table breaks a simulator rule and the reason.
type RuleError struct {
	Keyword string // PVTO or PVDG
	Record  int    // PVTO: the Rs record (1 = lowest Rs); PVDG: 0
	Row     int    // data row of the keyword, counted from 1 over all its records
	Line    int    // line of the deck
	Where   string // the row's values, in the deck's units
	Reason  string
}

func (e *RuleError) Error() string {
	rec := ""
	if e.Record > 0 {
		rec = fmt.Sprintf(" record %d,", e.Record)
	}
	return fmt.Sprintf("export: deck: %s%s row %d (deck line %d: %s): %s", e.Keyword, rec, e.Row, e.Line, e.Where, e.Reason)
}

// Unwrap returns ErrRule.
func (e *RuleError) Unwrap() error { return ErrRule }

// deckUnits are the units of the deck keywords (FIELD or METRIC), through the report units.
type deckUnits struct {
	keyword string     // FIELD, METRIC
	c       *converter // pressure, FVF, GOR base, gas FVF, viscosity, density, compressibility
	rsScale float64    // Rs in the converter's GOR unit is multiplied by this (FIELD: Mscf/STB)
	rsUnit  string     // "Mscf/STB", "sm3/sm3"
	bgUnit  string     // "rb/Mscf", "rm3/sm3"
	fvfUnit string     // "rb/STB", "rm3/sm3"
	pUnit   string     // "psia", "bara"
	cUnit   string     // "1/psi", "1/bar"
	rhoUnit string     // "lb/ft3", "kg/m3"
	muUnit  string     // "cP"
}

func newDeckUnits(u Units) deckUnits {
	if u == Metric {
		s := lab.UnitSet{Pressure: "bara", Temperature: "degC", GOR: "sm3/sm3", FVF: "m3/sm3", GasFVF: "m3/sm3", Viscosity: "cP", Density: "kg/m3", Compressibility: "1/bar"}
		return deckUnits{keyword: "METRIC", c: &converter{units: s}, rsScale: 1, rsUnit: "sm3/sm3", bgUnit: "rm3/sm3",
			fvfUnit: "rm3/sm3", pUnit: "bara", cUnit: "1/bar", rhoUnit: "kg/m3", muUnit: "cP"}
	}
	s := lab.UnitSet{Pressure: "psia", Temperature: "degF", GOR: "scf/STB", FVF: "rb/STB", GasFVF: "rb/Mscf", Viscosity: "cP", Density: "lbm/ft3", Compressibility: "1/psi"}
	return deckUnits{keyword: "FIELD", c: &converter{units: s}, rsScale: 1e-3, rsUnit: "Mscf/STB", bgUnit: "rb/Mscf",
		fvfUnit: "rb/STB", pUnit: "psia", cUnit: "1/psi", rhoUnit: "lb/ft3", muUnit: "cP"}
}

// deckWriter writes lines and counts them.
type deckWriter struct {
	b    bytes.Buffer
	line int
}

func (w *deckWriter) printf(format string, a ...any) {
	fmt.Fprintf(&w.b, format, a...)
	w.b.WriteByte('\n')
	w.line++
}

func (w *deckWriter) comment(s string) { w.printf("-- %s", s) }

// cells writes one data line: each cell right-aligned in 12 columns after two spaces, then
// the end (" /" or "").
func (w *deckWriter) cells(end string, cs ...string) {
	for _, c := range cs {
		w.b.WriteString("  ")
		for n := len(c); n < 12; n++ {
			w.b.WriteByte(' ')
		}
		w.b.WriteString(c)
	}
	w.b.WriteString(end)
	w.b.WriteByte('\n')
	w.line++
}

// cell formats a value for the deck and returns the number as written.
func cell(v float64) (string, float64) {
	s := num(v, deckDigits)
	x, _ := strconv.ParseFloat(s, 64)
	return s, x
}

// WriteDeck writes the table as an include file for the PROPS section of a black-oil deck:
// a comment header, then PVTO (live oil, each saturated row with its undersaturated branch),
// PVDG (dry gas), PVTW (water) and DENSITY (surface densities), in the FIELD or METRIC
// units of u. Nothing else goes in it. Before anything is written the numbers, as rounded for
// the deck, are checked against the rules the simulator enforces: Rs and the saturation
// pressure rising from record to record, Bo rising with Rs on the saturated rows, pressure
// rising with Bo falling and viscosity rising along each undersaturated branch, Bg falling
// with pressure; a table that breaks one gives a *RuleError and nothing is written.
func WriteDeck(w io.Writer, t *Table, u Units) error {
	du := newDeckUnits(u)
	c := du.c
	var dw deckWriter
	nrpvt, nppvt := len(t.Rows), len(t.Gas)
	for _, r := range t.Rows {
		nppvt = max(nppvt, len(r.Branch)+1)
	}
	for _, l := range headerLines(t, c) {
		dw.comment(l)
	}
	dw.comment(fmt.Sprintf("units: %s (the deck's RUNSPEC section must declare %s)", du.keyword, du.keyword))
	dw.comment(fmt.Sprintf("TABDIMS needs at least: NTPVT 1, NPPVT %d, NRPVT %d", nppvt, nrpvt))
	dw.comment("phases: OIL, GAS, WATER and DISGAS (live oil, dry gas)")
	dw.comment("")

	// PVTO
	dw.comment(fmt.Sprintf("live oil: Rs [%s], then P [%s], Bo [%s], viscosity [%s]: the saturated row, then its undersaturated branch",
		du.rsUnit, du.pUnit, du.fvfUnit, du.muUnit))
	dw.printf("PVTO")
	row := 0
	var prevRs, prevP, prevBo float64
	extrapNoted := false
	for i, r := range t.Rows {
		if r.Extrapolated && !extrapNoted {
			dw.comment("extrapolated below: bubble points above the report's, oils holding more gas than the report's")
			extrapNoted = true
		}
		rsS, rs := cell(c.to(lab.GOR, r.Rs) * du.rsScale)
		pS, p := cell(c.to(lab.Pressure, r.Pressure))
		boS, bo := cell(c.to(lab.FVF, r.Bo))
		muS, mu := cell(c.to(lab.Viscosity, r.OilViscosity))
		row++
		fail := func(reason string) error {
			where := fmt.Sprintf("Rs %s %s, P %s %s, Bo %s %s, viscosity %s %s", rsS, du.rsUnit, pS, du.pUnit, boS, du.fvfUnit, muS, du.muUnit)
			return &RuleError{Keyword: "PVTO", Record: i + 1, Row: row, Line: dw.line + 1, Where: where, Reason: reason}
		}
		switch {
		case !(bo > 0) || !(mu > 0) || rs < 0:
			return fail("Bo and viscosity must be positive and Rs not negative")
		case i > 0 && !(rs > prevRs):
			return fail(fmt.Sprintf("Rs is not above the previous record's %s %s: Rs must rise from record to record (the tuned solution-gas pair gives the same Rs at two bubble points)", num(prevRs, deckDigits), du.rsUnit))
		case i > 0 && !(p > prevP):
			return fail(fmt.Sprintf("the saturation pressure is not above the previous record's %s %s", num(prevP, deckDigits), du.pUnit))
		case i > 0 && !(bo > prevBo):
			return fail(fmt.Sprintf("Bo is not above the previous saturated row's %s %s: Bo must rise with Rs on saturated rows (the tuned bo family %s)", num(prevBo, deckDigits), du.fvfUnit, familyOf(t, "bo")))
		}
		prevRs, prevP, prevBo = rs, p, bo
		end := ""
		if len(r.Branch) == 0 {
			end = " /"
		}
		dw.cells(end, rsS, pS, boS, muS)
		bp, bb, bm := p, bo, mu
		for k, s := range r.Branch {
			spS, sp := cell(c.to(lab.Pressure, s.Pressure))
			sbS, sb := cell(c.to(lab.FVF, s.Bo))
			smS, sm := cell(c.to(lab.Viscosity, s.OilViscosity))
			row++
			fail := func(reason string) error {
				where := fmt.Sprintf("Rs %s %s, P %s %s, Bo %s %s, viscosity %s %s (undersaturated)", rsS, du.rsUnit, spS, du.pUnit, sbS, du.fvfUnit, smS, du.muUnit)
				return &RuleError{Keyword: "PVTO", Record: i + 1, Row: row, Line: dw.line + 1, Where: where, Reason: reason}
			}
			switch {
			case !(sp > bp):
				return fail(fmt.Sprintf("the pressure is not above the previous row's %s %s: pressure must rise along an undersaturated branch", num(bp, deckDigits), du.pUnit))
			case !(sb < bb):
				return fail(fmt.Sprintf("Bo is not below the previous row's %s %s: Bo must fall along an undersaturated branch (the tuned co family %s)", num(bb, deckDigits), du.fvfUnit, familyOf(t, "co")))
			case !(sm > bm):
				return fail(fmt.Sprintf("the viscosity is not above the previous row's %s %s: viscosity must rise along an undersaturated branch (the tuned mu_under family %s)", num(bm, deckDigits), du.muUnit, familyOf(t, "mu_under")))
			}
			bp, bb, bm = sp, sb, sm
			end := ""
			if k == len(r.Branch)-1 {
				end = " /"
			}
			dw.cells(end, "", spS, sbS, smS)
		}
	}
	dw.printf("/")
	dw.comment("")

	// PVDG
	dw.comment(fmt.Sprintf("dry gas: P [%s], Bg [%s], viscosity [%s]", du.pUnit, du.bgUnit, du.muUnit))
	dw.printf("PVDG")
	var prevGP, prevBg float64
	for i, g := range t.Gas {
		pS, p := cell(c.to(lab.Pressure, g.Pressure))
		bgS, bg := cell(c.to(lab.GasFVF, g.Bg))
		muS, mu := cell(c.to(lab.Viscosity, g.Viscosity))
		fail := func(reason string) error {
			where := fmt.Sprintf("P %s %s, Bg %s %s, viscosity %s %s", pS, du.pUnit, bgS, du.bgUnit, muS, du.muUnit)
			return &RuleError{Keyword: "PVDG", Row: i + 1, Line: dw.line + 1, Where: where, Reason: reason}
		}
		switch {
		case !(bg > 0) || !(mu > 0):
			return fail("Bg and viscosity must be positive")
		case i > 0 && !(p > prevGP):
			return fail(fmt.Sprintf("the pressure is not above the previous row's %s %s", num(prevGP, deckDigits), du.pUnit))
		case i > 0 && !(bg < prevBg):
			return fail(fmt.Sprintf("Bg is not below the previous row's %s %s: Bg must fall as pressure rises (the tuned z family %s)", num(prevBg, deckDigits), du.bgUnit, familyOf(t, "z")))
		}
		prevGP, prevBg = p, bg
		dw.cells("", pS, bgS, muS)
	}
	dw.printf("/")
	dw.comment("")

	// PVTW
	wt := t.Water
	dw.comment(fmt.Sprintf("water at %.4g wt %% salinity: Pref [%s], Bw [%s], cw [%s], viscosity [%s], viscosibility [%s]",
		wt.Salinity, du.pUnit, du.fvfUnit, du.cUnit, du.muUnit, du.cUnit))
	dw.printf("PVTW")
	pw, _ := cell(c.to(lab.Pressure, wt.RefPressure))
	bw, _ := cell(c.to(lab.FVF, wt.Bw))
	cwS, _ := cell(c.to(lab.Compressibility, wt.Cw))
	mw, _ := cell(c.to(lab.Viscosity, wt.Viscosity))
	cv, _ := cell(c.to(lab.Compressibility, wt.Viscosibility))
	dw.printf("  %12s  %12s  %12s  %12s  %12s /", pw, bw, cwS, mw, cv)
	dw.comment("")

	// DENSITY
	dw.comment(fmt.Sprintf("surface densities: oil, water, gas [%s]", du.rhoUnit))
	dw.printf("DENSITY")
	ro, _ := cell(c.to(lab.Density, t.Surface.Oil))
	rw, _ := cell(c.to(lab.Density, t.Surface.Water))
	rg, _ := cell(c.to(lab.Density, t.Surface.Gas))
	dw.printf("  %12s  %12s  %12s /", ro, rw, rg)
	if c.err != nil {
		return fmt.Errorf("export: deck: %w", c.err)
	}
	_, err := w.Write(dw.b.Bytes())
	return err
}

// familyOf names the family of a property in a table's source, for messages.
func familyOf(t *Table, prop string) string {
	for _, p := range t.Source.Properties {
		if string(p.Property) == prop {
			return strings.TrimSpace(p.Describe()[len(prop):])
		}
	}
	return "?"
}

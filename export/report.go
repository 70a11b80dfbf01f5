package export

import (
	"bytes"
	_ "embed"
	"errors"
	"fmt"
	"html/template"
	"io"
	"math"
	"sort"
	"strings"
	"time"

	"labmatch/fit"
	"labmatch/lab"
)

// ReportInput is what the HTML report is made from.
type ReportInput struct {
	Tool      string // "labmatch 0.1.0"
	Report    *lab.Report
	Dataset   *fit.Dataset
	Results   map[fit.PropertyID]fit.Result
	Options   fit.Options
	Model     *fit.Model  // nil: built from Results
	Ranking   fit.Ranking // nil: computed with Options
	Origin    string      // how the parameters were obtained, in words
	Generated time.Time   // the date printed; zero: now
	// Units of every number, table and axis the report shows; "" = Field. The tuning
	// parameters keep the fit engine's definitions (a shift in its field unit, with the
	// equivalent in these units beside it).
	Units Units
}

//go:embed report.html.tmpl
var reportTemplateText string

var reportTemplate = template.Must(template.New("report").Parse(reportTemplateText))

// WriteReport writes the HTML report: one self-contained file with its style sheet and SVG
// plots inlined, no script and no external reference. It holds the fluid summary, the QC
// findings, the ranking tables with leave-one-out errors, the tuned parameters with
// intervals and depths, for each tuned property a plot (lab points, published and tuned
// curves, excluded points, Pb), its ladder and residuals, the tuned fluid at a few pressures,
// the cautions, the report fingerprint, the tool version and the date.
func WriteReport(w io.Writer, in ReportInput) error {
	v, err := newReportView(in)
	if err != nil {
		return err
	}
	var b bytes.Buffer
	if err := reportTemplate.Execute(&b, v); err != nil {
		return fmt.Errorf("export: report: %w", err)
	}
	_, err = w.Write(b.Bytes())
	return err
}

// SaveReport writes the report to path atomically; an existing file is kept unless force is
// set, and a failure leaves it as it was.
func SaveReport(path string, in ReportInput, force bool) error {
	var b bytes.Buffer
	if err := WriteReport(&b, in); err != nil {
		return err
	}
	return lab.WriteFileAtomic(path, b.Bytes(), force)
}

type kv struct{ K, V string }

type findingView struct {
	Severity, Where, Message, Action string
}

type rankTable struct {
	ID, Title, Points string
	Rows              []rankRow
}

type rankRow struct {
	Rank                                                int
	Family, Depth, Published, Tuned, LOO, Mult, Remarks string
	Chosen, Failed, Outside                             bool
}

type paramRow struct {
	Prop, Title, Family, Depth, LOO, Published, Tuned string
	Params                                            []string
	Flags                                             []string
	NoFit                                             string
}

type propView struct {
	ID, Title, Family, Depth, Caption, NoFit string
	SVG                                      template.HTML
	Params, Flags, OutOfRange                []string
	Ladder                                   []ladderRow
	Residuals                                []residRow
	Unit, PUnit                              string
}

type ladderRow struct {
	Depth, Free, Params, AARE, MaxARE, LOO, Note string
	Chosen, Skipped                              bool
}

type residRow struct {
	Index                                                                   int
	Quantity, Source, Pressure, Lab, Published, Tuned, Unit, REPub, RETuned string
	Excluded                                                                bool
}

type stateRow struct {
	Cells []string
	Mark  string
}

type reportView struct {
	Title, Sample, Tool, Date, Fingerprint, Origin, Caution, Verdict string
	Summary, Tuned                                                   []kv
	Findings                                                         []findingView
	Ranking                                                          []rankTable
	Params                                                           []paramRow
	Props                                                            []propView
	FluidHead                                                        []string
	Fluid                                                            []stateRow
	Notes, Warnings                                                  []string
	Untuned                                                          []string
	Units                                                            Units
	UnitNote                                                         string
}

func newReportView(in ReportInput) (*reportView, error) {
	r, ds := in.Report, in.Dataset
	if r == nil || ds == nil || len(in.Results) == 0 {
		return nil, errors.New("export: report: a report, its dataset and tuning results are needed")
	}
	m := in.Model
	if m == nil {
		var err error
		if m, err = fit.NewModel(ds, in.Results, in.Options); err != nil {
			return nil, err
		}
	}
	rk := in.Ranking
	if rk == nil {
		rk = fit.Rank(ds, in.Options)
	}
	when := in.Generated
	if when.IsZero() {
		when = time.Now()
	}
	name := ds.Name
	if name == "" {
		name = r.Fluid.Sample
	}
	u := in.Units
	if u == "" {
		u = Field
	}
	if _, err := ParseUnits(string(u)); err != nil {
		return nil, fmt.Errorf("export: report: %w", err)
	}
	c := &converter{units: u.set()}
	// val formats a field value of q in the report's units with its unit: "3985.1 bara".
	val := func(q lab.Quantity, format string, x float64) string {
		return fmt.Sprintf(format+" %s", c.to(q, x), displayUnit(c, q))
	}
	v := &reportView{Title: "PVT report: " + name, Sample: name, Tool: in.Tool, Date: when.UTC().Format("2 January 2006"),
		Fingerprint: r.Fingerprint, Origin: in.Origin, Caution: Caution, Units: u}
	if u == Metric {
		var names []string
		for _, q := range []lab.Quantity{lab.Pressure, lab.Temperature, lab.GOR, lab.FVF, lab.Viscosity, lab.Density, lab.Compressibility} {
			names = append(names, displayUnit(c, q))
		}
		v.UnitNote = "Metric units: " + strings.Join(names, ", ") + ". The QC findings, the fluid-type rule, the no-fit remarks and the leave-one-out notes are quoted from the checks in field units (psia, °F, scf/STB, rb/STB, cP). " +
			"The tuning parameters are the fit engine's: multipliers and bends are ratios, refitted coefficients belong to the published equations in field units, and a shift is given in its field unit with the metric equivalent beside it."
	}
	if v.Fingerprint == "" {
		v.Fingerprint = "n/a (report built in memory)"
	}

	// Fluid summary.
	add := func(k, val string) { v.Summary = append(v.Summary, kv{k, val}) }
	add("sample", name)
	add("reservoir temperature", val(lab.Temperature, "%.4g", r.Fluid.Temperature))
	add("saturation pressure (report)", val(lab.Pressure, "%.6g", r.Fluid.Pb))
	add("stock-tank oil gravity", fmt.Sprintf("%.4g °API", r.Fluid.API))
	add("separator gas gravity", fmt.Sprintf("%.4g (air = 1)", ds.Oil.GasGravity))
	if t, ok := r.SelectedSeparator(); ok {
		sep := "test " + t.ID
		if len(t.Stages) > 1 {
			sep += fmt.Sprintf(", first stage %s and %s", val(lab.Pressure, "%.4g", t.Stages[0].Pressure), val(lab.Temperature, "%.4g", t.Stages[0].Temperature))
		}
		add("separator test used", sep)
	}
	add("Rsb (separator basis)", val(lab.GOR, "%.5g", ds.Rsb))
	add("Bob (separator basis)", val(lab.FVF, "%.5g", ds.Bob))
	if ft, why := lab.Classify(ds.Rsb, r.Fluid.API, ds.Bob); ft != lab.UnknownFluid {
		s := ft.String()
		if why != "" {
			s = why
			if !strings.HasPrefix(why, ft.String()) {
				s = ft.String() + " — " + why
			}
		}
		add("fluid type (McCain's rules of thumb)", s)
	}
	if r.Fluid.H2S > 0 || r.Fluid.CO2 > 0 || r.Fluid.N2 > 0 {
		add("non-hydrocarbons in the gas", fmt.Sprintf("H2S %.3g, CO2 %.3g, N2 %.3g mol %%", r.Fluid.H2S, r.Fluid.CO2, r.Fluid.N2))
	}
	add("standard conditions", val(lab.Pressure, "%.5g", ds.StdPressure)+", "+val(lab.Temperature, "%.4g", ds.StdTemp))
	tuned := func(k, val string) { v.Tuned = append(v.Tuned, kv{k, val}) }
	tuned("bubble point Pb", val(lab.Pressure, "%.6g", m.Pb))
	tuned("Bo at Pb", val(lab.FVF, "%.5g", m.Bob))
	tuned("dead-oil viscosity", val(lab.Viscosity, "%.4g", m.MuDead))
	tuned("oil viscosity at Pb", val(lab.Viscosity, "%.4g", m.MuB))

	// QC findings.
	fs := lab.Check(r)
	lab.SortFindings(fs)
	v.Verdict = lab.Verdict(fs)
	for _, f := range fs {
		where := f.File
		if f.Row > 0 {
			where += fmt.Sprintf(", line %d", f.Row)
		}
		if where == "" {
			where = "report"
		}
		v.Findings = append(v.Findings, findingView{Severity: f.Severity.String(), Where: where, Message: f.Message, Action: f.Action})
	}

	// Ranking.
	for _, p := range fit.Properties {
		es, ok := rk[p]
		if !ok {
			continue
		}
		t := rankTable{ID: "rank-" + string(p), Title: propertyTitle(p), Points: plural(len(ds.Points[p]), "point")}
		chosen := in.Results[p].Family
		for i, e := range es {
			row := rankRow{Rank: i + 1, Family: e.Family, Chosen: e.Family == chosen, Outside: !e.InRange}
			if e.Failed != "" {
				row.Failed, row.Depth, row.Published, row.Tuned, row.LOO, row.Mult = true, "–", "–", "–", "–", "–"
				row.Remarks = "cannot be evaluated: " + e.Failed
				t.Rows = append(t.Rows, row)
				continue
			}
			row.Depth = orNA(string(e.Depth))
			row.Published, row.Tuned, row.LOO, row.Mult = pct(e.AAREPublished), pct(e.AARETuned), pct(e.AARELOO), numPtr(e.Multiplier, "%.4g")
			var rem []string
			if !e.InRange {
				rem = append(rem, "outside its data: "+strings.Join(outOfRange(ds, p, e.Family, e.OutOfRange, c), "; "))
			}
			rem = append(rem, e.Flags...)
			row.Remarks = strings.Join(rem, "; ")
			t.Rows = append(t.Rows, row)
		}
		v.Ranking = append(v.Ranking, t)
	}

	// Parameters and per-property sections.
	for _, p := range fit.Properties {
		res, ok := in.Results[p]
		if !ok {
			continue
		}
		params := paramList(res, c)
		v.Params = append(v.Params, paramRow{Prop: string(p), Title: propertyTitle(p), Family: res.Family, Depth: orNA(string(res.Depth)),
			LOO: pct(res.LOO), Published: fmt.Sprintf("%.2f", res.Published.AARE), Tuned: fmt.Sprintf("%.2f", res.Tuned.AARE),
			Params: params, Flags: res.Flags, NoFit: res.NoFit})
		svg, err := propertyPlot(ds, res, in.Options, c)
		if err != nil {
			return nil, err
		}
		pv := propView{ID: "prop-" + string(p), Title: propertyTitle(p), Family: res.Family, Depth: orNA(string(res.Depth)),
			SVG: template.HTML(svg), Params: params, Flags: res.Flags, OutOfRange: outOfRange(ds, p, res.Family, res.OutOfRange, c), NoFit: res.NoFit,
			PUnit: displayUnit(c, lab.Pressure)}
		pv.Caption = fmt.Sprintf("%s: lab points (separator basis; crosses: excluded), the published %s correlation (dashed) and as tuned (solid, depth %s)",
			p, res.Family, pv.Depth)
		if p == fit.Co {
			pv.Caption += fmt.Sprintf(", above the CCE's saturation pressure %s.", val(lab.Pressure, "%.6g", ds.CCEPsat))
		} else {
			pv.Caption += fmt.Sprintf("; the dotted line marks the report's Pb (%s).", val(lab.Pressure, "%.6g", ds.Pb))
		}
		for _, rg := range res.Ladder {
			lr := ladderRow{Depth: string(rg.Depth), Chosen: rg.Chosen}
			switch {
			case rg.Skipped != "":
				lr.Skipped, lr.Free, lr.Params, lr.AARE, lr.MaxARE, lr.LOO, lr.Note = true, "–", "–", "–", "–", "–", "skipped: "+rg.Skipped
			default:
				lr.Free = fmt.Sprint(rg.Free)
				lr.Params = rungParams(p, rg, res.ShiftUnit)
				lr.AARE, lr.MaxARE, lr.LOO = fmt.Sprintf("%.2f", rg.Tuned.AARE), fmt.Sprintf("%.2f", rg.Tuned.MaxARE), pct(rg.LOO)
				lr.Note = rg.LOONote
				if len(rg.Flags) > 0 {
					lr.Note = strings.TrimPrefix(strings.Join(append([]string{lr.Note}, rg.Flags...), "; "), "; ")
				}
			}
			pv.Ladder = append(pv.Ladder, lr)
		}
		for i, rr := range res.Residuals {
			conv, unit := func(x float64) float64 { return x }, rr.Unit
			if q, ok := catalogQuantity(rr.Unit); ok {
				conv, unit = func(x float64) float64 { return c.to(q, x) }, displayUnit(c, q)
			}
			pd := "%.1f"
			if u == Metric {
				pd = "%.2f" // a bar is 14.5 psi
			}
			row := residRow{Index: i, Quantity: rr.Quantity, Pressure: fmt.Sprintf(pd, c.to(lab.Pressure, rr.Pressure)), Lab: fmt.Sprintf("%.5g", conv(rr.Lab)),
				Published: fmt.Sprintf("%.5g", conv(rr.Published)), Tuned: fmt.Sprintf("%.5g", conv(rr.Tuned)), Unit: unit,
				REPub: relPct(rr.Published, rr.Lab), RETuned: relPct(rr.Tuned, rr.Lab), Excluded: rr.Excluded}
			if rr.Source != "" {
				row.Source = rr.Source
				if rr.Line > 0 {
					row.Source += fmt.Sprintf(":%d", rr.Line)
				}
			}
			pv.Residuals = append(pv.Residuals, row)
		}
		v.Props = append(v.Props, pv)
	}
	for _, p := range m.Untuned {
		v.Untuned = append(v.Untuned, fmt.Sprintf("%s: %s (no lab data: published, untuned)", p, m.Families[p]))
	}

	// The tuned fluid at a few pressures.
	head := func(name string, q lab.Quantity) string { return name + " [" + displayUnit(c, q) + "]" }
	v.FluidHead = []string{head("p", lab.Pressure), head("Rs", lab.GOR), head("Bo", lab.FVF), head("oil viscosity", lab.Viscosity),
		head("oil density", lab.Density), "Z", head("Bg", lab.GasFVF), head("gas viscosity", lab.Viscosity)}
	pd := "%.1f"
	if u == Metric {
		pd = "%.2f"
	}
	for _, p := range fluidPressures(m.Pb, MaxLabPressure(r), ds.StdPressure) {
		s, err := m.At(p)
		if err != nil {
			continue
		}
		mark := ""
		if p == m.Pb {
			mark = "Pb"
		}
		v.Fluid = append(v.Fluid, stateRow{Mark: mark, Cells: []string{fmt.Sprintf(pd, c.to(lab.Pressure, p)), fmt.Sprintf("%.4g", c.to(lab.GOR, s.Rs)),
			fmt.Sprintf("%.5g", c.to(lab.FVF, s.Bo)), fmt.Sprintf("%.4g", c.to(lab.Viscosity, s.OilViscosity)), fmt.Sprintf("%.4g", c.to(lab.Density, s.OilDensity)),
			fmt.Sprintf("%.4g", s.Z), fmt.Sprintf("%.4g", c.to(lab.GasFVF, s.Bg)), fmt.Sprintf("%.4g", c.to(lab.Viscosity, s.GasViscosity))}})
	}
	v.Notes = ds.Notes
	for _, w := range ModelWarnings(m) {
		v.Warnings = append(v.Warnings, fmt.Sprintf("%s (%s): %s", w.Property, w.Family, w.fact(c, displayUnit)))
	}
	if c.err != nil {
		return nil, fmt.Errorf("export: report: %w", c.err)
	}
	return v, nil
}

// displayUnit is the unit of q as the report prints it: the unit set's name, with °F, °C
// and mPa·s for degF, degC and mPa.s.
func displayUnit(c *converter, q lab.Quantity) string {
	switch u := c.unit(q); u {
	case "degF":
		return "°F"
	case "degC":
		return "°C"
	case "mPa.s":
		return "mPa·s"
	default:
		return u
	}
}

// outOfRange states a family's inputs outside its data in the converter's units. The fit
// engine's own text (field units) is kept when the catalog's facts do not match it, so that
// nothing it found is dropped.
func outOfRange(ds *fit.Dataset, p fit.PropertyID, family string, engine []string, c *converter) []string {
	ws := DatasetWarnings(ds, p, family)
	if len(ws) != len(engine) {
		return engine
	}
	var out []string
	for _, w := range ws {
		out = append(out, w.fact(c, displayUnit))
	}
	return out
}

// fluidPressures picks the pressures of the tuned-fluid table: atmospheric, five below Pb,
// Pb, and three above it up to the highest lab pressure (or 1.5·Pb).
func fluidPressures(pb, maxLab, patm float64) []float64 {
	ps := []float64{patm}
	for _, f := range []float64{0.2, 0.4, 0.6, 0.8, 0.9} {
		ps = append(ps, math.Round(f*pb))
	}
	ps = append(ps, pb)
	top := math.Max(maxLab, 1.5*pb)
	for _, f := range []float64{1.0 / 3, 2.0 / 3, 1} {
		ps = append(ps, math.Round(pb+f*(top-pb)))
	}
	sort.Float64s(ps)
	return ps
}

func propertyTitle(p fit.PropertyID) string {
	switch p {
	case fit.Pb:
		return "Bubble point and solution GOR"
	case fit.Bo:
		return "Saturated oil FVF"
	case fit.Co:
		return "Undersaturated oil compressibility"
	case fit.MuDead:
		return "Dead-oil viscosity"
	case fit.MuSat:
		return "Saturated oil viscosity"
	case fit.MuUnder:
		return "Undersaturated oil viscosity"
	case fit.Z:
		return "Gas Z-factor"
	}
	return string(p)
}

// paramList gives a result's parameters with their 95 % intervals, in words.
func paramList(res fit.Result, c *converter) []string {
	q := res.Params
	var out []string
	name := "multiplier"
	if res.Property == fit.Pb && res.Depth != "" && res.Depth != fit.DepthPublished {
		name = "pressure scale"
	}
	out = append(out, fmt.Sprintf("%s %.5g%s", name, q.Multiplier, interval95(res, "multiplier", "%.5g")))
	if name == "pressure scale" {
		out[0] += " (fixed by the report's Pb)"
	}
	if res.Shifted || q.Shift != 0 {
		s := strings.TrimSpace(fmt.Sprintf("shift %.4g %s", q.Shift, res.ShiftUnit)) + interval95(res, "shift", "%.4g")
		if sq, ok := catalogQuantity(res.ShiftUnit); ok && c.unit(sq) != sq.FieldUnit() {
			// A shift is a difference: it converts by the scale of the units alone.
			d := func(x float64) float64 { return c.to(sq, x) - c.to(sq, 0) }
			s += fmt.Sprintf(" (%.4g %s", d(q.Shift), displayUnit(c, sq))
			if ci, ok := res.CI95["shift"]; ok {
				s += fmt.Sprintf(", 95 %% [%.4g, %.4g]", d(ci[0]), d(ci[1]))
			}
			s += ")"
		}
		out = append(out, s)
	}
	if q.Bend != 0 {
		out = append(out, fmt.Sprintf("bend %.5g (exponent on Rs/Rsb below Pb)%s", q.Bend, interval95(res, "bend", "%.5g")))
	}
	if q.Coefficients != nil {
		pub := fit.DeclaredCoefficients(res.Property, res.Family)
		for j, c := range q.Coefficients {
			if j < len(pub) && c == pub[j].Value {
				continue
			}
			id := fmt.Sprintf("c%d", j+1)
			if j < len(res.CoefficientIDs) {
				id = res.CoefficientIDs[j]
			}
			s := fmt.Sprintf("%s %.6g", id, c)
			if j < len(pub) {
				s += fmt.Sprintf(" (published %.6g)", pub[j].Value)
			}
			out = append(out, s+interval95(res, id, "%.6g"))
		}
	}
	if res.CIAssumed {
		out = append(out, "intervals from an assumed lab uncertainty (no spare points)")
	}
	return out
}

func interval95(res fit.Result, name, format string) string {
	ci, ok := res.CI95[name]
	if !ok {
		return ""
	}
	return fmt.Sprintf(", 95 %% ["+format+", "+format+"]", ci[0], ci[1])
}

// rungParams gives a rung's parameter values briefly.
func rungParams(p fit.PropertyID, rg fit.Rung, shiftUnit string) string {
	q := rg.Params
	if rg.Depth == fit.DepthPublished {
		return "0 (published)"
	}
	var s string
	if p == fit.Pb {
		s = fmt.Sprintf("%d: pressure scale %.4g (fixed by Pb)", rg.Free, q.Multiplier)
	} else {
		s = fmt.Sprintf("%d: m %.4g", rg.Free, q.Multiplier)
	}
	if q.Shift != 0 {
		s += strings.TrimRight(fmt.Sprintf(", s %.4g %s", q.Shift, shiftUnit), " ")
	}
	if q.Bend != 0 {
		s += fmt.Sprintf(", bend %.4g", q.Bend)
	}
	if q.Coefficients != nil {
		s += fmt.Sprintf(", %d coefficients", len(q.Coefficients))
	}
	return s
}

func orNA(s string) string {
	if s == "" {
		return "n/a"
	}
	return s
}

func pct(v *float64) string {
	if v == nil {
		return "n/a"
	}
	return fmt.Sprintf("%.2f", *v)
}

func numPtr(v *float64, format string) string {
	if v == nil {
		return "n/a"
	}
	return fmt.Sprintf(format, *v)
}

func relPct(v, lab float64) string {
	if lab == 0 || math.IsNaN(v) {
		return "n/a"
	}
	return fmt.Sprintf("%+.2f", 100*(v-lab)/lab)
}

// plural writes "1 point", "5 points".
func plural(n int, word string) string {
	if n == 1 {
		return fmt.Sprintf("%d %s", n, word)
	}
	return fmt.Sprintf("%d %ss", n, word)
}

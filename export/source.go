package export

import (
	"fmt"
	"math"
	"strings"

	"labmatch/correlations"
	"labmatch/fit"
	"labmatch/lab"
)

// Source says where a table's fluid description comes from, for the headers of the files
// written from it.
type Source struct {
	Tool        string // "labmatch 0.1.0"
	Report      string // the report's sample name
	Fingerprint string // SHA-256 of the report files; "" when not known
	Origin      string // how the parameters were obtained, in words
	Properties  []PropertySource
}

// PropertySource is the family and parameters of one property.
type PropertySource struct {
	Property  fit.PropertyID
	Family    string
	Depth     fit.Depth // the rung of the tuning ladder; "" when not recorded
	Params    fit.Params
	Shifted   bool   // the parameters include a shift
	ShiftUnit string // unit of Params.Shift
	Untuned   bool   // no lab data: a published default family
	// CoefficientIDs name Params.Coefficients (refit depth).
	CoefficientIDs []string
}

// NewSource describes a model built from results (fit.NewModel), in fit.Properties order.
func NewSource(tool, report, fingerprint, origin string, m *fit.Model, results map[fit.PropertyID]fit.Result) Source {
	s := Source{Tool: tool, Report: report, Fingerprint: fingerprint, Origin: origin}
	for _, p := range fit.Properties {
		ps := PropertySource{Property: p, Family: m.Families[p], Params: m.Params[p]}
		if r, ok := results[p]; ok {
			ps.Depth, ps.Shifted, ps.ShiftUnit = r.Depth, r.Shifted || r.Params.Shift != 0, r.ShiftUnit
			ps.CoefficientIDs = r.CoefficientIDs
		} else {
			ps.Untuned = true
		}
		s.Properties = append(s.Properties, ps)
	}
	return s
}

// Lines describes the source in a few lines of text for a file header, in field units.
func (s Source) Lines() []string { return s.lines(&converter{units: lab.FieldUnits()}, true) }

// lines is Lines with each shift stated in the converter's unit, and also in the unit the fit
// engine tunes it in when engine is set.
func (s Source) lines(c *converter, engine bool) []string {
	out := []string{fmt.Sprintf("written by %s from the report %q", s.Tool, s.Report)}
	if s.Fingerprint != "" {
		out = append(out, "report files SHA-256 "+s.Fingerprint)
	}
	if s.Origin != "" {
		out = append(out, "parameters: "+s.Origin)
	}
	for _, p := range s.Properties {
		out = append(out, p.describe(c, engine))
	}
	return out
}

// Describe gives one property's family, depth and parameters in words, in field units.
func (p PropertySource) Describe() string {
	return p.describe(&converter{units: lab.FieldUnits()}, true)
}

// describe is Describe with the shift stated in the converter's unit, and also in the unit
// the fit engine tunes it in (the tuning file's) when engine is set.
func (p PropertySource) describe(c *converter, engine bool) string {
	if p.Untuned {
		return fmt.Sprintf("%-8s %s (no lab data: published, untuned)", p.Property, p.Family)
	}
	depth := string(p.Depth)
	if depth == "" {
		depth = "n/a"
	}
	q := p.Params
	s := fmt.Sprintf("%-8s %s, depth %s, ", p.Property, p.Family, depth)
	if p.Property == fit.Pb && p.Depth != "" && p.Depth != fit.DepthPublished {
		s += fmt.Sprintf("pressure scale %.6g (fixed by the report's Pb)", q.Multiplier)
	} else {
		s += fmt.Sprintf("multiplier %.6g", q.Multiplier)
	}
	if p.Shifted {
		s += ", shift " + shiftText(q.Shift, p.ShiftUnit, c, "%.6g", engine)
	}
	if q.Bend != 0 {
		s += fmt.Sprintf(", bend %.6g", q.Bend)
	}
	if q.Coefficients != nil {
		pub := fit.DeclaredCoefficients(p.Property, p.Family)
		for j, c := range q.Coefficients {
			if j < len(pub) && c == pub[j].Value {
				continue
			}
			id := fmt.Sprintf("c%d", j+1)
			if j < len(p.CoefficientIDs) {
				id = p.CoefficientIDs[j]
			}
			if j < len(pub) {
				s += fmt.Sprintf(", %s %.6g (published %.6g)", id, c, pub[j].Value)
			} else {
				s += fmt.Sprintf(", %s %.6g", id, c)
			}
		}
	}
	return s
}

// FluidRecord is what a tuning file keeps of the report besides the tuned families, so that
// tables can be made from the tuning file alone. Field units.
type FluidRecord struct {
	API            float64 `json:"api"`
	GasGravity     float64 `json:"gas_gravity"`
	Temperature    float64 `json:"temperature_degf"`
	SepPressure    float64 `json:"separator_pressure_psia,omitempty"`
	SepTemperature float64 `json:"separator_temperature_degf,omitempty"`
	SepGasGravity  float64 `json:"separator_gas_gravity,omitempty"`
	// SepStagesGasGravity is the gravity of the gas of every stage ahead of the stock tank.
	SepStagesGasGravity float64 `json:"separator_stages_gas_gravity,omitempty"`
	Pb                  float64 `json:"pb_psia"`
	Rsb                 float64 `json:"rsb_scf_stb"`
	Bob                 float64 `json:"bob_rb_stb"`
	H2S                 float64 `json:"h2s_fraction,omitempty"`
	CO2                 float64 `json:"co2_fraction,omitempty"`
	StdPressure         float64 `json:"standard_pressure_psia"`
	StdTemp             float64 `json:"standard_temperature_degf"`
	MaxLabPressure      float64 `json:"max_lab_pressure_psia"`
}

// NewFluidRecord records a dataset's fluid description and the highest pressure of the report.
func NewFluidRecord(ds *fit.Dataset, r *lab.Report) FluidRecord {
	return FluidRecord{API: ds.Oil.API, GasGravity: ds.Oil.GasGravity, Temperature: ds.Oil.Temperature,
		SepPressure: ds.Oil.SepPressure, SepTemperature: ds.Oil.SepTemperature, SepGasGravity: ds.Oil.SepGasGravity,
		SepStagesGasGravity: ds.Oil.SepStagesGasGravity,
		Pb:                  ds.Pb, Rsb: ds.Rsb, Bob: ds.Bob, H2S: ds.H2S, CO2: ds.CO2, StdPressure: ds.StdPressure, StdTemp: ds.StdTemp,
		MaxLabPressure: MaxLabPressure(r)}
}

// Dataset rebuilds the part of a dataset that fit.NewModel needs (no lab points).
func (f FluidRecord) Dataset(name string) *fit.Dataset {
	return &fit.Dataset{Name: name, Pb: f.Pb, Rsb: f.Rsb, Bob: f.Bob, CCEPsat: f.Pb, H2S: f.H2S, CO2: f.CO2,
		StdPressure: f.StdPressure, StdTemp: f.StdTemp, Points: map[fit.PropertyID][]fit.Point{},
		Oil: correlations.Oil{API: f.API, GasGravity: f.GasGravity, Temperature: f.Temperature,
			SepPressure: f.SepPressure, SepTemperature: f.SepTemperature, SepGasGravity: f.SepGasGravity,
			SepStagesGasGravity: f.SepStagesGasGravity, Rsb: f.Rsb}}
}

// validate checks what a hand-edited or damaged fluid record could get wrong.
func (f FluidRecord) validate() error {
	pos := func(name string, v float64) error {
		if !(v > 0) || math.IsInf(v, 0) {
			return fmt.Errorf("fluid: %s %g, want a positive number", name, v)
		}
		return nil
	}
	for _, c := range []struct {
		name string
		v    float64
	}{{"api", f.API}, {"gas_gravity", f.GasGravity}, {"pb_psia", f.Pb}, {"rsb_scf_stb", f.Rsb}, {"bob_rb_stb", f.Bob},
		{"standard_pressure_psia", f.StdPressure}, {"temperature_degf", f.Temperature + correlations.RankineOffset}} {
		if err := pos(c.name, c.v); err != nil {
			return err
		}
	}
	for _, c := range []struct {
		name string
		v    float64
	}{{"h2s_fraction", f.H2S}, {"co2_fraction", f.CO2}} {
		if !(c.v >= 0 && c.v < 1) {
			return fmt.Errorf("fluid: %s %g, want a mole fraction from 0 to 1", c.name, c.v)
		}
	}
	for _, v := range []float64{f.SepPressure, f.SepTemperature, f.SepGasGravity, f.SepStagesGasGravity, f.StdTemp, f.MaxLabPressure} {
		if math.IsNaN(v) || math.IsInf(v, 0) {
			return fmt.Errorf("fluid: a value is not a number")
		}
	}
	return nil
}

// MaxLabPressure returns the highest pressure of a report's data (Pb, DL, CCE, viscosities), psia.
func MaxLabPressure(r *lab.Report) float64 {
	p := r.Fluid.Pb
	for _, s := range r.DL {
		p = math.Max(p, s.Pressure)
	}
	for _, c := range r.CCE {
		p = math.Max(p, c.Pressure)
	}
	for _, v := range r.Viscosity {
		p = math.Max(p, v.Pressure)
	}
	return p
}

// WithRecorded completes results evaluated at recorded parameters (fit.Apply on a loaded
// tuning file) with what the file recorded of the tuning itself and Apply does not redo: the
// depth, the ladder with its leave-one-out errors and the no-fit remark.
func WithRecorded(applied, stored map[fit.PropertyID]fit.Result) map[fit.PropertyID]fit.Result {
	for p, r := range applied {
		s, ok := stored[p]
		if !ok || s.Family != r.Family {
			continue
		}
		if r.Depth == "" {
			r.Depth = s.Depth
		}
		if r.Ladder == nil {
			r.Ladder = s.Ladder
		}
		if r.LOO == nil {
			r.LOO = s.LOO
		}
		if r.NoFit == "" {
			r.NoFit = s.NoFit
		}
		applied[p] = r
	}
	return applied
}

// shiftText states a shift of the fit engine's unit in the converter's unit; with engine set
// in both, the engine's first: "-4.54e-06 1/psi (-6.585e-05 1/bar)". A shift is a difference,
// so it converts by the scale of the units alone (no offset).
func shiftText(v float64, unit string, c *converter, format string, engine bool) string {
	q, ok := catalogQuantity(unit)
	if !ok || c.unit(q) == q.FieldUnit() {
		return strings.TrimSpace(fmt.Sprintf(format+" %s", v, unit))
	}
	conv := fmt.Sprintf(format+" %s", c.to(q, v)-c.to(q, 0), c.unit(q))
	if !engine {
		return conv
	}
	return fmt.Sprintf(format+" %s (%s)", v, unit, conv)
}

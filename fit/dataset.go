package fit

import (
	"fmt"
	"math"

	"labmatch/correlations"
	"labmatch/lab"
)

// deadOilMaxPressure is the highest pressure (psia) at which a viscosity reading is taken as
// the dead (residual) oil: the last DL stage is at atmospheric pressure (common practice).
const deadOilMaxPressure = 30

// Dataset is what the tuning engine needs from a report: the oil description, the
// bubble-point state and the separator-basis points of every property.
type Dataset struct {
	Name        string
	Oil         correlations.Oil
	Pb          float64 // psia, from the report
	Rsb         float64 // scf/STB, separator basis (Rsfb)
	Bob         float64 // rb/STB, separator basis (Bofb)
	MuDeadLab   float64 // cP, measured dead-oil viscosity at reservoir temperature; 0 if none
	MuBLab      float64 // cP, measured oil viscosity at Pb; 0 if none
	CCEPsat     float64 // psia, the pressure at which the CCE's V/Vsat = 1 (Pb when absent)
	H2S, CO2    float64 // mole fractions in the gas
	StdPressure float64 // psia
	StdTemp     float64 // °F
	Points      map[PropertyID][]Point
	Notes       []string // what was skipped or assumed, for the user
}

// NewDataset builds a dataset from a report: DL data are adjusted to the selected separator
// test first (lab.Report.SeparatorBasis).
func NewDataset(r *lab.Report) (*Dataset, error) {
	basis, err := r.SeparatorBasis()
	if err != nil {
		return nil, fmt.Errorf("fit: tuning needs separator-basis data: %w", err)
	}
	t, _ := r.SelectedSeparator()
	gg := r.GasGravity()
	if gg <= 0 {
		return nil, fmt.Errorf("fit: no separator gas gravity: give it in fluid.csv or separator.csv")
	}
	ds := &Dataset{
		Name: r.Fluid.Sample,
		Oil: correlations.Oil{
			API: r.Fluid.API, GasGravity: gg, Temperature: r.Fluid.Temperature,
		},
		Pb: r.Fluid.Pb, Rsb: basis.Rsfb, Bob: basis.Bofb,
		H2S: r.Fluid.H2S / 100, CO2: r.Fluid.CO2 / 100,
		StdPressure: r.Fluid.StdPressure, StdTemp: r.Fluid.StdTemperature,
		Points: map[PropertyID][]Point{},
	}
	if ds.StdPressure <= 0 {
		ds.StdPressure = 14.696
	}
	if ds.StdTemp == 0 {
		ds.StdTemp = 60
	}
	// The first stage's conditions and gas for the families that normalise the separator gas
	// (Vasquez–Beggs, Kartoatmodjo–Schmidt): for a single flash the separator is the stock tank.
	if len(t.Stages) > 0 {
		ds.Oil.SepPressure = t.Stages[0].Pressure
		ds.Oil.SepTemperature = t.Stages[0].Temperature
		ds.Oil.SepGasGravity = t.Stages[0].GasGravity
		ds.Oil.SepStagesGasGravity = t.SeparatorGasGravity()
	}
	ds.Oil.Rsb = ds.Rsb

	// pb: the report's Pb at Rsb, then the adjusted Rs below Pb.
	ds.add(Pb, Point{Quantity: "Pb", Unit: "psia", Pressure: ds.Pb, Lab: ds.Pb, Rs: ds.Rsb, Source: "fluid.csv", Line: r.Fluid.Line["saturation pressure"]})
	zeroRs, atmRs := 0, 0
	for _, p := range basis.Below {
		if p.Pressure >= ds.Pb*(1-1e-9) {
			continue
		}
		if p.Rs <= 0 {
			zeroRs++
			continue
		}
		if p.Pressure <= deadOilMaxPressure {
			// At stock-tank pressure the adjusted Rs is a small difference of large numbers;
			// its relative error would dominate the fit.
			atmRs++
			continue
		}
		ds.add(Pb, Point{Quantity: "Rs", Unit: "scf/STB", Pressure: p.Pressure, Lab: p.Rs, Rs: p.Rs, Source: p.Source, Line: p.Line})
	}
	if atmRs > 0 {
		ds.Notes = append(ds.Notes, fmt.Sprintf("pb: the adjusted Rs at atmospheric pressure is left out (%d stage): a small difference of large numbers", atmRs))
	}
	if zeroRs > 0 {
		ds.Notes = append(ds.Notes, fmt.Sprintf("pb: %d stage(s) with Rs = 0 left out (a relative error needs a value above zero)", zeroRs))
	}
	// bo: adjusted Bo at and below Pb with the lab Rs. Where the adjusted Rs came out below
	// zero (the residual oil of a DL that liberated more gas than the separator test), the
	// conversion to separator basis no longer describes the oil: its Bo is left out too.
	clampedBo := 0
	for _, p := range basis.Below {
		if p.Clamped {
			clampedBo++
			continue
		}
		ds.add(Bo, Point{Quantity: "Bo", Unit: "rb/STB", Pressure: p.Pressure, Lab: p.Bo, Rs: p.Rs, Source: p.Source, Line: p.Line})
	}
	if clampedBo > 0 {
		ds.Notes = append(ds.Notes, fmt.Sprintf("bo: %d stage(s) whose adjusted Rs came out below zero left out: the separator-basis conversion does not hold there", clampedBo))
	}
	// co: average compressibility from the CCE's saturation pressure to p. The relative
	// volumes are V/Vsat at the CCE's own Psat, which may differ a little from fluid.csv's.
	ds.CCEPsat = ds.Pb
	for _, c := range r.CCE {
		if math.Abs(c.RelVolume-1) < 1e-9 {
			ds.CCEPsat = c.Pressure
		}
	}
	dropped := 0
	for _, c := range r.CCE {
		if c.Pressure <= ds.CCEPsat {
			continue
		}
		if !(c.RelVolume > 0 && c.RelVolume < 1) {
			dropped++
			continue
		}
		co := -math.Log(c.RelVolume) / (c.Pressure - ds.CCEPsat)
		ds.add(Co, Point{Quantity: "co avg", Unit: "1/psi", Pressure: c.Pressure, Lab: co, Rs: ds.Rsb, Source: "cce.csv", Line: c.Line})
	}
	if dropped > 0 {
		ds.Notes = append(ds.Notes, fmt.Sprintf("co: %d CCE point(s) above Psat with V/Vsat ≥ 1 left out (the oil must shrink as pressure rises)", dropped))
	}
	// viscosities.
	for _, v := range r.Viscosity {
		if v.Oil <= 0 {
			continue
		}
		pt := Point{Unit: "cP", Pressure: v.Pressure, Lab: v.Oil, Source: "viscosity.csv", Line: v.Line}
		switch {
		case v.Pressure <= deadOilMaxPressure:
			pt.Quantity = "mu_dead"
			ds.MuDeadLab = v.Oil
			ds.add(MuDead, pt)
		case v.Pressure <= ds.Pb*(1+1e-6):
			pt.Quantity = "mu"
			pt.Rs = basis.RsAt(v.Pressure)
			if math.Abs(v.Pressure-ds.Pb) <= 0.005*ds.Pb {
				ds.MuBLab = v.Oil
			}
			ds.add(MuSat, pt)
		default:
			pt.Quantity = "mu"
			pt.Rs = ds.Rsb
			ds.add(MuUnder, pt)
		}
	}
	if len(ds.Points[MuUnder]) > 0 && ds.MuBLab == 0 {
		ds.Notes = append(ds.Notes, "mu_under: no viscosity measured at Pb; the tuned saturated viscosity at Pb is used")
	}
	// z: reported Z of the DL gas.
	for _, st := range r.DL {
		if st.Z <= 0 || st.Residual60 {
			continue
		}
		g := st.GasGravity
		if g <= 0 {
			g = gg
		}
		ds.add(Z, Point{Quantity: "Z", Unit: "", Pressure: st.Pressure, Lab: st.Z, GasGravity: g, Source: "dl.csv", Line: st.Line})
	}
	for _, p := range Properties {
		if len(ds.Points[p]) == 0 {
			ds.Notes = append(ds.Notes, fmt.Sprintf("%s: no lab data, skipped", p))
		}
	}
	return ds, nil
}

func (ds *Dataset) add(p PropertyID, pt Point) { ds.Points[p] = append(ds.Points[p], pt) }

// rangeInputs gives the values that catalog ranges are checked against.
func (ds *Dataset) rangeInputs() map[string]float64 { return rangeInputs(ds.Oil, ds.Rsb, ds.Pb) }

// RangeInputs gives the values that the families' catalog ranges are checked against on this
// report (Entry.Check, Entry.CheckValues): the oil's API, gas gravity and temperature, Rsb, Pb.
func (ds *Dataset) RangeInputs() map[string]float64 { return ds.rangeInputs() }

func rangeInputs(o correlations.Oil, rsb, pb float64) map[string]float64 {
	return map[string]float64{
		"API": o.API, "gas gravity": o.GasGravity, "temperature": o.Temperature,
		"Rsb": rsb, "Pb": pb, "Rs": rsb, "p": pb,
	}
}

// Command gen makes the demo reports of package samples from the project's own correlations:
// a known family and multiplier per property, small noise, and DL numbers that the DL →
// separator adjustment turns back into the intended separator-basis values.
//
// Usage: go run ./internal/gen -out data   (from the samples folder; see go:generate)
package main

import (
	"flag"
	"fmt"
	"math"
	"math/rand/v2"
	"os"
	"path/filepath"

	"labmatch/correlations"
	"labmatch/lab"
	"labmatch/samples/internal/spec"
)

func main() {
	out := flag.String("out", "data", "folder to write the demo reports into")
	flag.Parse()
	for _, s := range spec.Specs {
		r, err := build(s)
		if err != nil {
			fmt.Fprintln(os.Stderr, "gen:", s.ID+":", err)
			os.Exit(1)
		}
		units := lab.FieldUnits()
		if s.Metric {
			units = lab.MetricUnits()
			roundIn(r, units)
		}
		if err := lab.WriteFolder(filepath.Join(*out, s.ID), r, lab.WriteOptions{Units: units, Force: true}); err != nil {
			fmt.Fprintln(os.Stderr, "gen:", err)
			os.Exit(1)
		}
	}
}

// truth evaluates the intended (tuned) separator-basis fluid.
type truth struct {
	s     spec.Spec
	oil   correlations.Oil
	sg    correlations.SolutionGasFamily
	bo    correlations.OilFVFFamily
	co    correlations.CompressibilityFamily
	dead  correlations.DeadViscosityFamily
	sat   correlations.SatViscosityFamily
	under correlations.UnderViscosityFamily
	pb    float64
	bob   float64
	muod  float64
	muob  float64
}

func newTruth(s spec.Spec, sepP, sepT, sepGG float64) (*truth, error) {
	t := &truth{s: s, oil: correlations.Oil{API: s.API, GasGravity: s.GasGravity, Temperature: s.Temperature,
		SepPressure: sepP, SepTemperature: sepT, SepGasGravity: sepGG}}
	var err error
	if t.sg, err = correlations.SolutionGasByID(s.Pb); err != nil {
		return nil, err
	}
	if t.bo, err = correlations.OilFVFByID(s.Bo); err != nil {
		return nil, err
	}
	if t.co, err = correlations.CompressibilityByID(s.Co); err != nil {
		return nil, err
	}
	if t.dead, err = correlations.DeadViscosityByID(s.MuDead); err != nil {
		return nil, err
	}
	if t.sat, err = correlations.SatViscosityByID(s.MuSat); err != nil {
		return nil, err
	}
	if t.under, err = correlations.UnderViscosityByID(s.MuUnder); err != nil {
		return nil, err
	}
	if s.PbCoef != nil {
		with := t.sg
		t.sg.BubblePoint = func(r float64, o correlations.Oil) (float64, error) { return with.BubblePointWith(r, o, s.PbCoef) }
		t.sg.SolutionGOR = func(p float64, o correlations.Oil) (float64, error) { return with.SolutionGORWith(p, o, s.PbCoef) }
	}
	if s.BoCoef != nil {
		with := t.bo
		t.bo.FVF = func(p, rs float64, o correlations.Oil) (float64, error) { return with.FVFWith(p, rs, o, s.BoCoef) }
	}
	pb, err := t.sg.BubblePoint(s.Rsb, t.oil)
	if err != nil {
		return nil, err
	}
	t.pb = s.MPb * pb
	if t.bob, err = t.boSat(t.pb, s.Rsb); err != nil {
		return nil, err
	}
	d, err := t.dead.Viscosity(t.oil)
	if err != nil {
		return nil, err
	}
	t.muod = s.MMuDead * d
	if t.muob, err = t.muSat(s.Rsb); err != nil {
		return nil, err
	}
	return t, nil
}

func (t *truth) rs(p float64) (float64, error) {
	if p >= t.pb {
		return t.s.Rsb, nil
	}
	v, err := t.sg.SolutionGOR(p/t.s.MPb, t.oil)
	return math.Max(0, v), err
}

func (t *truth) boSat(p, rs float64) (float64, error) {
	v, err := t.bo.FVF(p, rs, t.oil)
	return 1 + t.s.MBo*(v-1), err
}

func (t *truth) relVol(p float64) (float64, error) {
	rv, err := t.co.RelativeVolume(p, t.pb, t.s.Rsb, t.oil)
	return math.Exp(t.s.MCo * math.Log(rv)), err
}

func (t *truth) muSat(rs float64) (float64, error) {
	v, err := t.sat.Viscosity(t.muod, rs, t.oil)
	return t.s.MMuSat * v, err
}

func (t *truth) muUnder(p float64) (float64, error) {
	v, err := t.under.Viscosity(p, t.pb, t.muob, t.oil)
	if err != nil {
		return 0, err
	}
	v0, err := t.under.Viscosity(t.pb, t.pb, t.muob, t.oil)
	return t.muob + t.s.MMuUnder*(v-v0), err
}

func (t *truth) z(p, gg float64) (float64, error) {
	ppc, tpc, err := correlations.SuttonCritical(gg)
	if err != nil {
		return 0, err
	}
	z, err := correlations.DranchukAbouKassem((t.s.Temperature+459.67)/tpc, p/ppc)
	return 1 + t.s.MZ*(z-1), err // the departure from the ideal gas, so Z → 1 as p → 0
}

// round rounds v to the given number of decimals, as a lab report prints it.
func round(v float64, dec int) float64 {
	f := math.Pow(10, float64(dec))
	return math.Round(v*f) / f
}

// build makes one demo report.
func build(s spec.Spec) (*lab.Report, error) {
	rng := rand.New(rand.NewPCG(s.Seed, 0x1ab))
	noise := func() float64 { return 1 + s.Noise*rng.NormFloat64() }
	std := 14.696
	const atm = 14.7

	// Separator tests: first-stage pressure differs; the middle one gives the most stock-tank oil.
	sepPs := []float64{64.7, 114.7, 214.7}
	sepTs := []float64{72, 75, 78}
	gStock := s.GasGravity + 0.45 // stock-tank gas is heavier (common practice)
	firstFrac := func(i int) float64 { return 0.78 + 0.04*float64(i) }
	firstGravity := func(i int) float64 { // so that the GOR-weighted gravity is s.GasGravity
		f := firstFrac(i)
		return round((s.GasGravity-gStock*(1-f))/f, 3)
	}
	t, err := newTruth(s, sepPs[1], sepTs[1], firstGravity(1))
	if err != nil {
		return nil, err
	}
	r := &lab.Report{Fluid: lab.Fluid{
		Sample: s.Well + " bottom-hole sample (invented)", Temperature: s.Temperature,
		Pb: round(t.pb, 0), API: s.API, StdPressure: std, StdTemperature: 60,
	}}
	for i, sp := range sepPs {
		scaleB, scaleR := 1.0, 1.0
		if i != 1 {
			scaleB, scaleR = 1+0.004*float64(i+1), 1+0.006*float64(i+1)
		}
		total := s.Rsb * scaleR
		first := total * firstFrac(i)
		stock := total - first
		test := lab.SeparatorTest{ID: fmt.Sprintf("S%d", i+1), Bofb: round(t.bob*scaleB, 4), API: round(s.API-0.2*float64(i-1), 1)}
		if i == 1 {
			test.Bofb = round(t.bob, 4)
		}
		test.Stages = []lab.SeparatorStage{
			{Stage: "1", Pressure: sp, Temperature: sepTs[i], GOR: round(first, 0), GasGravity: firstGravity(i)},
			{Stage: "stock tank", Pressure: atm, Temperature: 60, GOR: round(stock, 0), GasGravity: round(gStock, 3)},
		}
		r.Separator = append(r.Separator, test)
	}
	sel := r.Separator[1]
	bofb, rsfb := sel.Bofb, sel.Rsfb()

	// DL: separator-basis truth at each stage, then un-adjusted with Bodb/Bofb = ratio.
	fracs := []float64{1, 0.86, 0.72, 0.59, 0.47, 0.36, 0.26, 0.17, 0.09}
	var press []float64
	for _, f := range fracs {
		press = append(press, round(t.pb*f, 0))
	}
	press = append(press, atm)
	press[0] = r.Fluid.Pb
	ratio := 1.045 + 0.01*float64(s.Seed%3)
	rsLast, err := t.rs(atm)
	if err != nil {
		return nil, err
	}
	bodb := round(bofb*ratio, 4)
	rsdb := round((rsfb-rsLast)*bodb/bofb, 0)
	basis := lab.SeparatorBasis{Bofb: bofb, Rsfb: rsfb, Bodb: bodb, Rsdb: rsdb}
	gasDL := func(p float64) float64 { // liberated-gas gravity rises as pressure falls
		x := 1 - p/t.pb
		return s.GasGravity - 0.06 + 0.55*x*x*x
	}
	for i, p := range press {
		rs, err := t.rs(p)
		if err != nil {
			return nil, err
		}
		bo, err := t.boSat(p, rs)
		if err != nil {
			return nil, err
		}
		// Bod is measured to about 1e-4: the noise goes on the expansion Bo − 1.
		st := lab.DLStage{Pressure: p, Bod: round(basis.UnadjustBo(1+(bo-1)*noise()), 4)}
		if i == 0 {
			st.Bod = bodb
			st.Rsd = rsdb
		} else if i == len(press)-1 {
			st.Rsd = 0
		} else {
			st.Rsd = round(basis.UnadjustRs(rs*noise()), 0)
		}
		if i > 0 {
			st.GasGravity = round(gasDL(p), 3)
		}
		if i > 0 && i < len(press)-1 { // Z and Bg of the atmospheric stage are not reported
			z, err := t.z(p, st.GasGravity)
			if err != nil {
				return nil, err
			}
			st.Z = round(z*noise(), 4)
			st.Bg = round(std/519.67*st.Z*(s.Temperature+459.67)/p, 5)
		}
		r.DL = append(r.DL, st)
	}
	// Oil density down the DL by mass balance: residual oil plus the gas liberated below.
	gammaO := 141.5 / (131.5 + s.API)
	resMass := 5.614583 * 62.37 * gammaO // lbm per bbl of residual oil at 60 °F
	for i := range r.DL {
		mass := resMass
		for j := i + 1; j < len(r.DL); j++ {
			mass += (r.DL[j-1].Rsd - r.DL[j].Rsd) * 0.0764 * r.DL[j].GasGravity
		}
		r.DL[i].OilDensity = round(mass/(5.614583*r.DL[i].Bod), 2)
		if r.DL[i].Bg > 0 {
			r.DL[i].Bt = round(r.DL[i].Bod+r.DL[i].Bg/5.614583*(rsdb-r.DL[i].Rsd), 4)
		}
	}

	// CCE: single phase from the compressibility, two phase on a straight Y-function.
	pb := r.Fluid.Pb
	yA, yB := 1.2+0.002*s.API, 4.5e-4+4e-8*s.Rsb // Y = yA + yB·p
	for _, dp := range []float64{3500, 2800, 2100, 1400, 700} {
		p := pb + dp
		rv, err := t.relVol(p)
		if err != nil {
			return nil, err
		}
		r.CCE = append(r.CCE, lab.CCEPoint{Pressure: p, RelVolume: round(rv, 4)})
	}
	r.CCE = append(r.CCE, lab.CCEPoint{Pressure: pb, RelVolume: 1})
	for _, f := range []float64{0.93, 0.85, 0.76, 0.66, 0.55, 0.44, 0.34} {
		p := round(pb*f, 0)
		y := (yA + yB*p) * (1 + 0.004*rng.NormFloat64())
		rv := 1 + (pb-p)/(p*y)
		r.CCE = append(r.CCE, lab.CCEPoint{Pressure: p, RelVolume: round(rv, 4), Y: round((pb-p)/(p*(round(rv, 4)-1)), 4)})
	}

	// Viscosity: above Pb, at Pb, at some DL stages, and the dead oil at atmospheric pressure.
	for _, dp := range []float64{3000, 2000, 1000} {
		mu, err := t.muUnder(pb + dp)
		if err != nil {
			return nil, err
		}
		r.Viscosity = append(r.Viscosity, lab.ViscosityPoint{Pressure: pb + dp, Oil: round(mu*noise(), 3)})
	}
	r.Viscosity = append(r.Viscosity, lab.ViscosityPoint{Pressure: pb, Oil: round(t.muob*noise(), 3)})
	for _, i := range []int{2, 4, 6, 8} {
		p := press[i]
		rs, err := t.rs(p)
		if err != nil {
			return nil, err
		}
		mu, err := t.muSat(rs)
		if err != nil {
			return nil, err
		}
		r.Viscosity = append(r.Viscosity, lab.ViscosityPoint{Pressure: p, Oil: round(mu*noise(), 3)})
	}
	r.Viscosity = append(r.Viscosity, lab.ViscosityPoint{Pressure: atm, Oil: round(t.muod*noise(), 3)})
	return r, nil
}

// roundIn rounds every value of r as a lab would print it in the units u (a metric report
// prints 274.76 bara, not the conversion of 3985 psia), keeping r in field units.
func roundIn(r *lab.Report, u lab.UnitSet) {
	rd := func(q lab.Quantity, v *float64, dec int) {
		if *v == 0 {
			return
		}
		x, err := lab.FromField(q, u.Unit(q), *v)
		if err != nil {
			return
		}
		if y, err := lab.ToField(q, u.Unit(q), round(x, dec)); err == nil {
			*v = y
		}
	}
	f := &r.Fluid
	rd(lab.Temperature, &f.Temperature, 1)
	rd(lab.Pressure, &f.Pb, 2)
	rd(lab.Pressure, &f.StdPressure, 5)
	rd(lab.Temperature, &f.StdTemperature, 2)
	for i := range r.DL {
		st := &r.DL[i]
		rd(lab.Pressure, &st.Pressure, 2)
		rd(lab.GOR, &st.Rsd, 1)
		rd(lab.FVF, &st.Bod, 4)
		rd(lab.FVF, &st.Bt, 4)
		rd(lab.Density, &st.OilDensity, 1)
		rd(lab.GasFVF, &st.Bg, 6)
	}
	for i := range r.Separator {
		t := &r.Separator[i]
		rd(lab.FVF, &t.Bofb, 4)
		for j := range t.Stages {
			st := &t.Stages[j]
			rd(lab.Pressure, &st.Pressure, 2)
			rd(lab.Temperature, &st.Temperature, 1)
			rd(lab.GOR, &st.GOR, 1)
		}
	}
	for i := range r.CCE {
		rd(lab.Pressure, &r.CCE[i].Pressure, 2)
		rd(lab.Density, &r.CCE[i].Density, 1)
	}
	for i := range r.Viscosity {
		rd(lab.Pressure, &r.Viscosity[i].Pressure, 2)
		rd(lab.Viscosity, &r.Viscosity[i].Oil, 3)
	}
}

package export

import (
	"errors"
	"fmt"
	"math"
	"slices"

	"labmatch/correlations"
	"labmatch/fit"
)

// Table limits and defaults.
const (
	// DefaultPoints is the number of saturated pressures (atmospheric to PMax, Pb added) when
	// neither TableOptions.Step nor Points is given.
	DefaultPoints = 30
	// MaxPoints bounds the saturated rows of a table (each has a branch of up to as many rows).
	MaxPoints = 500
	// DefaultSalinity is the formation-water salinity that the command line assumes when none is
	// given, wt % (30,000 ppm: a moderately saline oilfield brine, below sea water's 3.5 %).
	DefaultSalinity = 3.0
	// pmaxFactor: the default highest table pressure is at least this multiple of Pb (the
	// table must reach above Pb for undersaturated cells and gas re-solution).
	pmaxFactor = 1.5
	// nearPb: grid pressures closer to Pb than this fraction of the local spacing give way to
	// Pb, so that no two saturated rows crowd each other.
	nearPb = 0.2
)

// TableOptions control a black-oil table.
type TableOptions struct {
	// PMax is the highest saturated pressure, psia; 0 = the larger of 1.5·Pb and
	// MaxLabPressure. It may not lie below the tuned Pb.
	PMax float64
	// MaxLabPressure is the highest pressure of the report's data, psia (for the default PMax).
	MaxLabPressure float64
	// Step is the spacing of the saturated pressures, psi: atmospheric, then multiples of Step
	// up to PMax. 0 = Points.
	Step float64
	// Points is the number of evenly spaced saturated pressures from atmospheric to PMax when
	// Step is 0; 0 = DefaultPoints. Pb is always added.
	Points int
	// Salinity of the formation water, wt % of dissolved solids (NaCl equivalent); 0 = fresh water.
	Salinity float64
}

// Table is a black-oil table at reservoir temperature: saturated rows from atmospheric
// pressure to PMax, each with its undersaturated branch, the dry gas at the same pressures,
// the formation water and the surface densities. All values are in field units.
type Table struct {
	Source      Source
	Temperature float64 // reservoir temperature, °F
	StdPressure float64 // psia
	StdTemp     float64 // °F
	Pb          float64 // tuned bubble point of the report's oil, psia
	Rsb         float64 // scf/STB
	Bob         float64 // tuned Bo at Pb, rb/STB
	PMax        float64 // highest saturated pressure, psia
	Rows        []SatRow
	Gas         []GasRow // rising pressure: every saturated pressure and the top branch pressure
	Water       Water
	Surface     SurfaceDensities
	Warnings    []Warning // inputs outside the data of the families used and of the water correlations
}

// SatRow is one saturated row (the oil at its bubble point) and its undersaturated branch.
type SatRow struct {
	fit.State
	// Extrapolated marks a row above the report's bubble point: a hypothetical oil holding
	// more gas than the report's, from the tuned solution-gas pair continued (needed where gas
	// re-dissolves).
	Extrapolated bool
	Branch       []fit.State // pressures above the row's, rising; Rs as the row's
	// NoBranch says why the row has no undersaturated branch: the tuned families cannot
	// describe that oil above its bubble point (for example a compressibility correlation that
	// needs Rs > 0 on the dead-oil row). Simulators then take the branch shape of the next
	// record; the highest row always has a branch.
	NoBranch string
	// noBranchCause is the correlation's own complaint in NoBranch, without the fit engine's
	// context (which quotes pressures in psia), for files in other units.
	noBranchCause string
}

// GasRow is the dry gas at one pressure.
type GasRow struct {
	Pressure  float64 // psia
	Z         float64
	Bg        float64 // rcf/scf
	Viscosity float64 // cP
}

// SurfaceDensities are the densities at standard conditions, lbm/ft³.
type SurfaceDensities struct {
	Oil, Water, Gas float64
}

// Water is the formation water at reservoir temperature, from published correlations.
type Water struct {
	Salinity      float64 // wt %
	Concentration float64 // g/L at standard conditions
	RefPressure   float64 // psia: the reference pressure of the deck's water table (the tuned Pb)
	Bw            float64 // rb/STB at RefPressure
	Cw            float64 // 1/psi at RefPressure
	Viscosity     float64 // cP at RefPressure
	Viscosibility float64 // (1/μw)·dμw/dp at RefPressure, 1/psi
	Families      string  // the correlations used, in words
}

// WaterPoint is the formation water at one pressure.
type WaterPoint struct {
	Bw, Cw, Viscosity float64
}

// Water correlation ids (catalog) used by the tables.
const waterFamilies = "Bw McCain (1990), cw Osif (1988), μw McCain (1990), surface density McCain (1990)"

// gasSurfaceDensityPerGravity is the mass (lbm) of one standard cubic foot of gas of unit
// gravity: 0.0136 lbm per scf·STB/ft³ × 5.614583 ft³/bbl = 0.07636 lbm/ft³, the constant of
// correlations.OilDensity, so that the simulator's reservoir oil density (ρo,sc + Rs·ρg,sc)/Bo
// equals the tool's.
const gasSurfaceDensityPerGravity = 0.0136 * 5.614583

// oilSurfaceDensityPerGravity is water at 60 °F, lbm/ft³, as in correlations.OilDensity.
const oilSurfaceDensityPerGravity = 62.4

// BuildTable evaluates the tuned model on a pressure grid. src describes where the model came
// from (for the file headers).
func BuildTable(m *fit.Model, src Source, opts TableOptions) (*Table, error) {
	if m == nil {
		return nil, errors.New("export: tables: no model")
	}
	t := &Table{Source: src, Temperature: m.Oil.Temperature, StdPressure: m.StdPressure, StdTemp: m.StdTemp,
		Pb: m.Pb, Rsb: m.Rsb, Bob: m.Bob}
	if t.StdPressure <= 0 {
		t.StdPressure = correlations.StdPressure
	}
	pmax := opts.PMax
	if pmax == 0 {
		pmax = math.Max(pmaxFactor*m.Pb, opts.MaxLabPressure)
	}
	switch {
	case !(pmax > 0) || math.IsInf(pmax, 0):
		return nil, fmt.Errorf("export: tables: highest pressure %g psia, want a positive number", pmax)
	case pmax < m.Pb*(1-1e-9):
		return nil, fmt.Errorf("export: tables: highest pressure %.6g psia is below the tuned bubble point %.6g psia; the table must hold Pb", pmax, m.Pb)
	case opts.Step < 0 || math.IsNaN(opts.Step) || math.IsInf(opts.Step, 0):
		return nil, fmt.Errorf("export: tables: pressure step %g psi, want a positive number", opts.Step)
	case opts.Points < 0 || opts.Points == 1:
		return nil, fmt.Errorf("export: tables: %d pressures, want at least 2", opts.Points)
	}
	t.PMax = pmax
	grid, err := pressureGrid(t.StdPressure, pmax, m.Pb, opts.Step, opts.Points)
	if err != nil {
		return nil, err
	}
	for _, p := range grid {
		row, err := saturatedRow(m, p)
		if err != nil {
			return nil, err
		}
		t.Rows = append(t.Rows, row)
	}
	// Branches: every higher grid pressure; the top row gets one point a spacing above it,
	// since a simulator needs an undersaturated branch on the last row.
	top := grid[len(grid)-1]
	above := top + math.Max(top-grid[len(grid)-2], 1)
	for i := range t.Rows {
		r := &t.Rows[i]
		ps := grid[i+1:]
		if i == len(t.Rows)-1 {
			ps = []float64{above}
		}
		for _, p := range ps {
			s, err := m.Undersaturated(r.Rs, p)
			if err != nil && errors.Is(err, correlations.ErrInput) && i < len(t.Rows)-1 {
				// The oil lies outside a family's domain above its bubble point: no branch.
				// The file headers say so (headerLines), in their units.
				r.Branch, r.NoBranch, r.noBranchCause = nil, err.Error(), inputCause(err)
				break
			}
			if err != nil {
				return nil, fmt.Errorf("export: tables: undersaturated branch of the row at %.6g psia (Rs %.6g scf/STB): %w", r.Pressure, r.Rs, err)
			}
			r.Branch = append(r.Branch, s)
		}
	}
	for _, r := range t.Rows {
		t.Gas = append(t.Gas, GasRow{Pressure: r.Pressure, Z: r.Z, Bg: r.Bg, Viscosity: r.GasViscosity})
	}
	last := t.Rows[len(t.Rows)-1].Branch
	s := last[len(last)-1]
	t.Gas = append(t.Gas, GasRow{Pressure: s.Pressure, Z: s.Z, Bg: s.Bg, Viscosity: s.GasViscosity})

	if t.Water, err = newWater(m.Oil.Temperature, m.Pb, opts.Salinity); err != nil {
		return nil, err
	}
	if t.Surface.Water, err = correlations.McCainBrineDensity(opts.Salinity); err != nil {
		return nil, fmt.Errorf("export: tables: water density: %w", err)
	}
	t.Surface.Oil = oilSurfaceDensityPerGravity * m.Oil.OilGravity()
	t.Surface.Gas = gasSurfaceDensityPerGravity * m.Oil.GasGravity
	t.Warnings = append(ModelWarnings(m), waterWarnings(t.Water, m.Oil.Temperature, pmax)...)
	return t, nil
}

// saturatedRow evaluates the oil at its bubble point p: the report's oil below Pb (Rs from the
// tuned pair), the report's Pb itself, and above it an oil holding more gas.
func saturatedRow(m *fit.Model, p float64) (SatRow, error) {
	if p <= m.Pb {
		s, err := m.At(p)
		if err != nil {
			return SatRow{}, fmt.Errorf("export: tables: saturated row at %.6g psia: %w", p, err)
		}
		return SatRow{State: s}, nil
	}
	rs, err := rsAtBubblePoint(m, p)
	if err != nil {
		return SatRow{}, fmt.Errorf("export: tables: saturated row at %.6g psia (above the tuned Pb %.6g psia): %w", p, m.Pb, err)
	}
	s, err := m.Saturated(rs)
	if err != nil {
		return SatRow{}, fmt.Errorf("export: tables: saturated row at %.6g psia: %w", p, err)
	}
	s.Pressure = p // the solution's bubble point agrees with p to 1e-11
	return SatRow{State: s, Extrapolated: true}, nil
}

// rsAtBubblePoint solves BubblePoint(rs) = p for rs above Rsb by bracketing and false position
// (Illinois variant); the tuned bubble point rises with rs.
func rsAtBubblePoint(m *fit.Model, p float64) (float64, error) {
	f := func(rs float64) (float64, error) {
		pb, err := m.BubblePoint(rs)
		return pb - p, err
	}
	lo, hi := m.Rsb, 2*math.Max(m.Rsb, 1)
	flo, err := f(lo)
	if err != nil {
		return 0, err
	}
	fhi, err := f(hi)
	for n := 0; err == nil && fhi < 0; n++ {
		if n == 40 {
			return 0, fmt.Errorf("no solution GOR up to %.6g scf/STB has its bubble point at %.6g psia", hi, p)
		}
		lo, flo = hi, fhi
		hi *= 2
		fhi, err = f(hi)
	}
	if err != nil {
		return 0, err
	}
	if flo > 0 {
		return 0, fmt.Errorf("the tuned bubble point does not rise with Rs above Rsb")
	}
	side := 0
	for range 200 {
		x := hi - fhi*(hi-lo)/(fhi-flo)
		fx, err := f(x)
		if err != nil {
			return 0, err
		}
		if math.Abs(fx) <= 1e-11*p || hi-lo <= 1e-13*hi {
			return x, nil
		}
		if fx > 0 {
			hi, fhi = x, fx
			if side == 1 {
				flo /= 2
			}
			side = 1
		} else {
			lo, flo = x, fx
			if side == -1 {
				fhi /= 2
			}
			side = -1
		}
	}
	return 0, fmt.Errorf("no convergence finding the Rs whose bubble point is %.6g psia", p)
}

// pressureGrid returns the saturated pressures: pmin, then multiples of step (or points evenly
// spaced values) up to pmax, with pb inserted and grid values crowding it removed.
func pressureGrid(pmin, pmax, pb, step float64, points int) ([]float64, error) {
	if pmax <= pmin {
		return nil, fmt.Errorf("export: tables: highest pressure %.6g psia is not above atmospheric (%.6g psia)", pmax, pmin)
	}
	var g []float64
	spacing := 0.0
	if step > 0 {
		n := (pmax - pmin) / step
		if n > MaxPoints {
			return nil, fmt.Errorf("export: tables: a step of %g psi makes %.0f rows; at most %d (raise the step)", step, n, MaxPoints)
		}
		g = append(g, pmin)
		for k := math.Floor(pmin/step) + 1; k*step < pmax-nearPb*step; k++ {
			if k*step > pmin+nearPb*step {
				g = append(g, k*step)
			}
		}
		g = append(g, pmax)
		spacing = step
	} else {
		if points == 0 {
			points = DefaultPoints
		}
		if points > MaxPoints {
			return nil, fmt.Errorf("export: tables: %d rows; at most %d", points, MaxPoints)
		}
		spacing = (pmax - pmin) / float64(points-1)
		for i := range points {
			g = append(g, pmin+float64(i)*spacing)
		}
		g[points-1] = pmax
	}
	out := g[:0:0]
	for i, p := range g {
		interior := i > 0 && i < len(g)-1
		if interior && math.Abs(p-pb) < nearPb*spacing {
			continue
		}
		out = append(out, p)
	}
	if !slices.Contains(out, pb) {
		out = append(out, pb)
		slices.Sort(out)
	}
	if len(out) < 2 {
		return nil, fmt.Errorf("export: tables: the pressure grid has fewer than two rows")
	}
	return out, nil
}

// newWater evaluates the formation water at the reference pressure pref.
func newWater(tF, pref, salinity float64) (Water, error) {
	w := Water{Salinity: salinity, RefPressure: pref, Families: waterFamilies}
	var err error
	if w.Concentration, err = correlations.BrineConcentration(salinity); err != nil {
		return w, fmt.Errorf("export: tables: water: %w", err)
	}
	pt, err := WaterAt(pref, tF, salinity)
	if err != nil {
		return w, err
	}
	w.Bw, w.Cw, w.Viscosity = pt.Bw, pt.Cw, pt.Viscosity
	if w.Viscosibility, err = correlations.McCainWaterViscosibility(pref); err != nil {
		return w, fmt.Errorf("export: tables: water viscosibility: %w", err)
	}
	return w, nil
}

// WaterAt evaluates the formation water of salinity wt % at p psia and tF °F.
func WaterAt(p, tF, salinity float64) (WaterPoint, error) {
	var w WaterPoint
	var err error
	if w.Bw, err = correlations.McCainWaterFVF(p, tF); err != nil {
		return w, fmt.Errorf("export: tables: water FVF at %.6g psia: %w", p, err)
	}
	c, err := correlations.BrineConcentration(salinity)
	if err != nil {
		return w, fmt.Errorf("export: tables: water: %w", err)
	}
	if w.Cw, err = correlations.OsifWaterCompressibility(p, tF, c); err != nil {
		return w, fmt.Errorf("export: tables: water compressibility at %.6g psia: %w", p, err)
	}
	if w.Viscosity, err = correlations.McCainWaterViscosity(p, tF, salinity); err != nil {
		return w, fmt.Errorf("export: tables: water viscosity at %.6g psia: %w", p, err)
	}
	return w, nil
}

// inputCause is the innermost error of err's chain that wraps correlations.ErrInput (the
// correlation's "input out of the physical domain: Rsb = 0, want > 0 …"), or err's text.
func inputCause(err error) string {
	cause := err
	for e := err; e != nil; e = errors.Unwrap(e) {
		if errors.Unwrap(e) == correlations.ErrInput {
			cause = e
			break
		}
	}
	return cause.Error()
}

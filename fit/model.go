package fit

import (
	"fmt"
	"math"

	"labmatch/correlations"
)

// DefaultFamilies are used for a property that the report has no data for, so that the
// model can still evaluate it (published, untuned; Model.Untuned lists them).
var DefaultFamilies = Choice{
	Pb: "standing", Bo: "standing", Co: "vasquez-beggs", MuDead: "beggs-robinson",
	MuSat: "beggs-robinson", MuUnder: "vasquez-beggs", Z: "sutton+dak",
}

// coBelowFamily gives the oil compressibility below Pb (published, untuned).
const coBelowFamily = "mccain-rollins-villena"

// Model is a tuned fluid description: the chosen family and parameters of every property. It
// evaluates the black-oil properties at any pressure at reservoir temperature.
type Model struct {
	Oil         correlations.Oil
	Rsb         float64 // scf/STB
	Pb          float64 // tuned bubble point, psia: Pb_tuned(Rsb)
	Bob         float64 // tuned Bo at Pb, rb/STB
	MuDead      float64 // tuned dead-oil viscosity, cP
	MuB         float64 // tuned oil viscosity at Pb, cP
	H2S, CO2    float64 // mole fractions in the gas
	StdPressure float64 // psia
	StdTemp     float64 // °F
	Families    Choice
	Params      map[PropertyID]Params
	Untuned     []PropertyID // properties evaluated with a published default family

	sg    pbModel
	bo    boModel
	co    correlations.CompressibilityFamily
	coLow *correlations.CompressibilityFamily
	sat   correlations.SatViscosityFamily
	under correlations.UnderViscosityFamily
	z     zModel
}

// State is every black-oil property at one pressure.
type State struct {
	Pressure     float64 `json:"pressure_psia"`
	Rs           float64 `json:"rs_scf_stb"`
	Bo           float64 `json:"bo_rb_stb"`
	Co           float64 `json:"co_per_psi"`
	OilDensity   float64 `json:"oil_density_lbm_ft3"`
	OilViscosity float64 `json:"oil_viscosity_cp"`
	Z            float64 `json:"z"`
	Bg           float64 `json:"bg_rcf_scf"`
	GasViscosity float64 `json:"gas_viscosity_cp"`
}

// NewModel builds the tuned model from tuning results (TuneAll). Properties absent from
// results use DefaultFamilies with published parameters.
func NewModel(ds *Dataset, results map[PropertyID]Result, opts Options) (*Model, error) {
	m := &Model{Oil: ds.Oil, Rsb: ds.Rsb, H2S: ds.H2S, CO2: ds.CO2, StdPressure: ds.StdPressure,
		StdTemp: ds.StdTemp, Families: Choice{}, Params: map[PropertyID]Params{}}
	for _, p := range Properties {
		if r, ok := results[p]; ok {
			m.Families[p], m.Params[p] = r.Family, r.Params
		} else {
			m.Families[p], m.Params[p] = DefaultFamilies[p], Published
			m.Untuned = append(m.Untuned, p)
		}
	}
	sg, err := correlations.SolutionGasByID(m.Families[Pb])
	if err != nil {
		return nil, err
	}
	oil := m.Oil
	if oil.Rsb == 0 {
		oil.Rsb = m.Rsb
	}
	m.sg = pbModel{sg, oil, m.Rsb}
	bo, err := correlations.OilFVFByID(m.Families[Bo])
	if err != nil {
		return nil, err
	}
	m.bo = boModel{bo, m.Oil}
	for _, p := range Properties {
		n := len(DeclaredCoefficients(p, m.Families[p]))
		if c := m.Params[p].Coefficients; c != nil && len(c) != n {
			return nil, fmt.Errorf("fit: model: %s %s: %d coefficients, the family declares %d", p, m.Families[p], len(c), n)
		}
	}
	if m.co, err = correlations.CompressibilityByID(m.Families[Co]); err != nil {
		return nil, err
	}
	if f, err := correlations.CompressibilityByID(coBelowFamily); err == nil {
		m.coLow = &f
	}
	dead, err := correlations.DeadViscosityByID(m.Families[MuDead])
	if err != nil {
		return nil, err
	}
	if m.sat, err = correlations.SatViscosityByID(m.Families[MuSat]); err != nil {
		return nil, err
	}
	if m.under, err = correlations.UnderViscosityByID(m.Families[MuUnder]); err != nil {
		return nil, err
	}
	zm, err := newModel(ds, Z, m.Families[Z], opts, 0, 0)
	if err != nil {
		return nil, err
	}
	m.z = zm.(zModel)

	if m.Pb, err = m.sg.pb(m.Params[Pb], m.Rsb); err != nil {
		return nil, fmt.Errorf("fit: model: bubble point: %w", err)
	}
	if m.Bob, err = m.boSat(m.Pb, m.Rsb); err != nil {
		return nil, fmt.Errorf("fit: model: Bo at Pb: %w", err)
	}
	mud, err := muDeadModel{dead, m.Oil}.value(m.Params[MuDead].Coefficients)
	if err != nil {
		return nil, fmt.Errorf("fit: model: dead-oil viscosity: %w", err)
	}
	m.MuDead = m.Params[MuDead].Multiplier*mud + m.Params[MuDead].Shift
	if m.MuB, err = m.muSat(m.Rsb); err != nil {
		return nil, fmt.Errorf("fit: model: viscosity at Pb: %w", err)
	}
	return m, nil
}

// Rs returns the tuned solution GOR at p, scf/STB.
func (m *Model) Rs(p float64) (float64, error) {
	if p >= m.Pb {
		return m.Rsb, nil
	}
	rs, err := m.sg.rs(m.Params[Pb], p)
	return math.Max(0, math.Min(rs, m.Rsb)), err
}

// BubblePoint returns the tuned bubble point (psia) of an oil holding rs scf/STB: the report's
// oil at rs = Rsb, and above Rsb the hypothetical oils with more gas that a table needs when gas
// re-dissolves (extrapolated beyond the report).
func (m *Model) BubblePoint(rs float64) (float64, error) {
	v, err := m.sg.pb(m.Params[Pb], rs)
	if err != nil {
		return 0, fmt.Errorf("fit: model: bubble point at Rs %g scf/STB: %w", rs, err)
	}
	return v, nil
}

func (m *Model) boSat(p, rs float64) (float64, error) {
	q := m.Params[Bo]
	v, err := m.bo.value(q.Coefficients, p, rs)
	return 1 + q.Multiplier*(v-1) + q.Shift, err
}

func (m *Model) muSat(rs float64) (float64, error) {
	v, err := muSatModel{m.sat, m.Oil, m.MuDead}.value(m.Params[MuSat].Coefficients, m.MuDead, rs)
	q := m.Params[MuSat]
	return q.Multiplier*v + q.Shift, err
}

// QuantityError says which quantity of a state could not be evaluated, and why.
type QuantityError struct {
	Quantity string // "Rs", "Bo", "co", "oil density", "oil viscosity", "Z", "Bg", "gas viscosity"
	Pressure float64
	Err      error
}

func (e QuantityError) Error() string {
	return fmt.Sprintf("fit: model: %s at %.6g psia: %v", e.Quantity, e.Pressure, e.Err)
}

func (e QuantityError) Unwrap() error { return e.Err }

// At evaluates every property at pressure p (psia) and reservoir temperature for the report's
// oil: saturated at and below the tuned Pb, undersaturated above it. The error is the first
// quantity that could not be evaluated; Evaluate gives the rest as well.
func (m *Model) At(p float64) (State, error) {
	s, errs := m.Evaluate(p)
	if len(errs) > 0 {
		return s, errs[0]
	}
	return s, nil
}

// Evaluate is At that evaluates every quantity it can: a quantity that fails (a correlation
// outside its domain for this oil) is left zero and listed, the others are still given.
func (m *Model) Evaluate(p float64) (State, []QuantityError) {
	if !(p > 0) || math.IsInf(p, 0) {
		return State{Pressure: p}, []QuantityError{{"pressure", p, fmt.Errorf("want > 0 psia")}}
	}
	if p > m.Pb {
		return m.undersaturated(m.Rsb, m.Pb, p)
	}
	rs, err := m.Rs(p)
	if err != nil {
		return State{Pressure: p}, []QuantityError{{"Rs", p, err}}
	}
	return m.saturated(p, rs)
}

// Saturated evaluates every property of an oil holding rs scf/STB at its tuned bubble point
// (BubblePoint(rs)): one saturated row of a black-oil table.
func (m *Model) Saturated(rs float64) (State, error) {
	pb, err := m.BubblePoint(rs)
	if err != nil {
		return State{}, err
	}
	if !(pb > 0) {
		return State{}, fmt.Errorf("fit: model: bubble point %g psia at Rs %g scf/STB, want > 0", pb, rs)
	}
	return first(m.saturated(pb, rs))
}

func first(s State, errs []QuantityError) (State, error) {
	if len(errs) > 0 {
		return s, errs[0]
	}
	return s, nil
}

func (m *Model) saturated(p, rs float64) (State, []QuantityError) {
	s := State{Pressure: p, Rs: rs}
	var errs []QuantityError
	var err error
	boOK := true
	if s.Bo, err = m.boSat(p, rs); err != nil {
		errs, boOK = append(errs, QuantityError{"Bo", p, err}), false
	}
	if s.OilViscosity, err = m.muSat(rs); err != nil {
		errs = append(errs, QuantityError{"oil viscosity", p, err})
	}
	if m.coLow != nil {
		pb, rsb := m.Pb, m.Rsb
		if p > m.Pb { // a saturated row of an oil with more gas than the report's
			pb, rsb = p, rs
		}
		if s.Co, err = m.coLow.Co(p, pb, rsb, m.Oil); err != nil {
			s.Co = 0 // the below-Pb compressibility is informative only
		}
	}
	return s, m.withOilDensityAndGas(&s, boOK, errs)
}

// Undersaturated evaluates every property of an oil holding rs scf/STB at a pressure p above
// its tuned bubble point: Bo = Bo(Pb)·exp(−∫co dp) with the tuned compressibility, and the
// tuned viscosity increase above the viscosity at Pb. With rs = Rsb it is the report's oil
// above Pb; with other rs, one point of an undersaturated branch of a black-oil table.
func (m *Model) Undersaturated(rs, p float64) (State, error) {
	if !(p > 0) || math.IsInf(p, 0) {
		return State{}, fmt.Errorf("fit: model: pressure %g psia, want > 0", p)
	}
	pb, err := m.BubblePoint(rs)
	if err != nil {
		return State{}, err
	}
	if p < pb {
		return State{}, fmt.Errorf("fit: model: %g psia is below the bubble point %.6g psia of an oil with Rs %g scf/STB", p, pb, rs)
	}
	return first(m.undersaturated(rs, pb, p))
}

func (m *Model) undersaturated(rs, pb, p float64) (State, []QuantityError) {
	s := State{Pressure: p, Rs: rs}
	var errs []QuantityError
	boOK := true
	bob, err := m.boSat(pb, rs)
	if err != nil {
		errs, boOK = append(errs, QuantityError{"Bo", p, fmt.Errorf("at the bubble point %.6g psia: %w", pb, err)}), false
	}
	// The co tuning m·co + s was fitted to the report's oil. For an oil with other Rs (a branch
	// of a table) the shift is carried as a fraction of the report's compressibility over the
	// same span above its bubble point: co_tuned = co·(m + s/co_ref), which is the tuned
	// correlation for the report's oil and never turns a small compressibility negative.
	qc := m.Params[Co]
	dp := p - pb
	avgFactor, instFactor := qc.Multiplier, qc.Multiplier
	if qc.Shift != 0 {
		if dp > 0 {
			rvRef, err := m.co.RelativeVolume(m.Pb+dp, m.Pb, m.Rsb, m.Oil)
			if err != nil || !(rvRef > 0 && rvRef < 1) {
				errs = append(errs, QuantityError{"co", p, fmt.Errorf("the report's relative volume %g above Pb: %v", rvRef, err)})
			} else {
				avgFactor += qc.Shift / (-math.Log(rvRef) / dp)
			}
		}
		if coRef, err := m.co.Co(m.Pb+dp, m.Pb, m.Rsb, m.Oil); err == nil && coRef > 0 {
			instFactor += qc.Shift / coRef
		} else {
			errs = append(errs, QuantityError{"co", p, fmt.Errorf("the report's compressibility above Pb: %v", err)})
		}
	}
	if boOK {
		rv, err := m.co.RelativeVolume(p, pb, rs, m.Oil)
		switch {
		case err != nil:
			errs, boOK = append(errs, QuantityError{"Bo", p, fmt.Errorf("relative volume: %w", err)}), false
		case !(rv > 0):
			errs, boOK = append(errs, QuantityError{"Bo", p, fmt.Errorf("relative volume %g, want > 0", rv)}), false
		default:
			s.Bo = bob * math.Exp(avgFactor*math.Log(rv))
		}
	}
	if co, err := m.co.Co(p, pb, rs, m.Oil); err != nil {
		errs = append(errs, QuantityError{"co", p, err})
	} else {
		s.Co = instFactor * co
	}
	if mub, err := m.muSat(rs); err != nil {
		errs = append(errs, QuantityError{"oil viscosity", p, fmt.Errorf("viscosity at Pb %.6g psia: %w", pb, err)})
	} else if mu, err := m.under.Viscosity(p, pb, mub, m.Oil); err != nil {
		errs = append(errs, QuantityError{"oil viscosity", p, err})
	} else if mu0, err := m.under.Viscosity(pb, pb, mub, m.Oil); err != nil {
		errs = append(errs, QuantityError{"oil viscosity", p, fmt.Errorf("at Pb: %w", err)})
	} else {
		qu := m.Params[MuUnder]
		s.OilViscosity = mub + qu.Multiplier*(mu-mu0) + qu.Shift
	}
	return s, m.withOilDensityAndGas(&s, boOK, errs)
}

// withOilDensityAndGas completes a state with the oil density (when Bo is known) and the gas
// properties at its pressure, adding what fails to errs.
func (m *Model) withOilDensityAndGas(s *State, boOK bool, errs []QuantityError) []QuantityError {
	var err error
	p := s.Pressure
	if boOK {
		if s.OilDensity, err = correlations.OilDensity(s.Rs, s.Bo, m.Oil); err != nil {
			errs = append(errs, QuantityError{"oil density", p, err})
		}
	} else {
		errs = append(errs, QuantityError{"oil density", p, fmt.Errorf("needs Bo")})
	}
	z, err := m.z.z(p, m.Oil.GasGravity)
	if err != nil {
		return append(errs, QuantityError{"Z", p, err})
	}
	qz := m.Params[Z]
	s.Z = 1 + qz.Multiplier*(z-1) + qz.Shift
	if s.Bg, err = correlations.GasFVFStd(s.Z, p, m.Oil.Temperature, m.StdPressure, m.StdTemp); err != nil {
		errs = append(errs, QuantityError{"Bg", p, err})
	}
	if s.GasViscosity, err = correlations.LeeGonzalezEakin(m.Oil.Temperature, p, s.Z, m.Oil.GasGravity); err != nil {
		errs = append(errs, QuantityError{"gas viscosity", p, err})
	}
	return errs
}

// PublishedModel builds a model from published correlations only: the chosen family of each
// property (DefaultFamilies where choice has none) with multiplier 1. ds needs Oil and Rsb.
func PublishedModel(ds *Dataset, choice Choice, opts Options) (*Model, error) {
	res := map[PropertyID]Result{}
	for _, p := range Properties {
		fam := choice[p]
		if fam == "" {
			fam = DefaultFamilies[p]
		}
		res[p] = Result{Property: p, Family: fam, Params: Published}
	}
	return NewModel(ds, res, opts)
}

// RangeInputs gives the values that the model's families' catalog ranges are checked against
// (the tuned Pb and Rsb), as RangeWarnings uses them.
func (m *Model) RangeInputs() map[string]float64 { return rangeInputs(m.Oil, m.Rsb, m.Pb) }

// RangeWarnings lists, for every family of the model, the inputs outside the range of the
// family's original data.
func (m *Model) RangeWarnings() []string {
	in := rangeInputs(m.Oil, m.Rsb, m.Pb)
	var ws []string
	for _, p := range Properties {
		if e, err := catalogEntry(p, m.Families[p]); err == nil {
			for _, w := range e.Check(in) {
				ws = append(ws, fmt.Sprintf("%s (%s): %s", p, m.Families[p], w))
			}
		}
	}
	return ws
}

package fit

import (
	"fmt"
	"math"

	"labmatch/correlations"
)

// model is how a property's family predicts its lab points: affine or nonlinear.
type model interface {
	// coefficients are the family's declared refit coefficients; nil when it has none.
	coefficients() []correlations.Coefficient
}

// nonlinear predicts a property at its points for given parameters. predict must not
// allocate: it runs for every objective evaluation.
type nonlinear interface {
	model
	predict(q Params, pts []Point, out []float64) error
}

// affine is a model whose prediction is a + m·b + s at every point, with a and b from the
// correlation with coefficients c (nil: published). With published coefficients the tuner
// evaluates the correlation once and then only does the arithmetic.
type affine interface {
	model
	basis(c []float64, pts []Point, a, b []float64) error
}

// newModel builds the model of one family of one property for a dataset. muDead and muB
// carry the dead-oil viscosity and the viscosity at Pb that the live-oil families need.
func newModel(ds *Dataset, p PropertyID, family string, opts Options, muDead, muB float64) (model, error) {
	switch p {
	case Pb:
		f, err := correlations.SolutionGasByID(family)
		oil := ds.Oil
		if oil.Rsb == 0 {
			oil.Rsb = ds.Rsb
		}
		return pbModel{f, oil, ds.Rsb}, err
	case Bo:
		f, err := correlations.OilFVFByID(family)
		return boModel{f, ds.Oil}, err
	case Co:
		f, err := correlations.CompressibilityByID(family)
		return coModel{f, ds.Oil, ds.CCEPsat, ds.Rsb}, err
	case MuDead:
		f, err := correlations.DeadViscosityByID(family)
		return muDeadModel{f, ds.Oil}, err
	case MuSat:
		f, err := correlations.SatViscosityByID(family)
		return muSatModel{f, ds.Oil, muDead}, err
	case MuUnder:
		f, err := correlations.UnderViscosityByID(family)
		return muUnderModel{f, ds.Oil, ds.Pb, muB}, err
	case Z:
		pcID, zID := splitZFamily(family, opts)
		f, err := correlations.ZByID(zID)
		if err != nil {
			return nil, err
		}
		pc, err := correlations.PseudoCriticalByID(pcID)
		return zModel{f, pc, ds.Oil.Temperature, ds.H2S, ds.CO2}, err
	}
	return nil, fmt.Errorf("fit: unknown property %q", p)
}

// pbModel is the tuned solution-gas pair
//
//	Pb_tuned(R) = m·Pb_c(R') + s,  R' = Rsb·(R/Rsb)^(1/e),
//	Rs_tuned(p) = Rsb·[Rs_c((p − s)/m)/Rsb]^e,
//
// Pb_c and Rs_c the family's pair with coefficients c (an exact inverse pair), e the bend. The
// tuned pair is an exact inverse for every m > 0, e > 0 and c, and at R = Rsb the bend drops
// out, so the anchor m = (Pb − s)/Pb_c(Rsb) makes Pb_tuned(Rsb) = Pb and Rs_tuned(Pb) = Rsb.
type pbModel struct {
	f   correlations.SolutionGasFamily
	oil correlations.Oil
	rsb float64 // the report's Rsb, the reference of the bend
}

func (m pbModel) coefficients() []correlations.Coefficient { return m.f.Coefficients }

func (m pbModel) publishedPb(rs float64, c []float64) (float64, error) {
	if c == nil || m.f.BubblePointWith == nil {
		return m.f.BubblePoint(rs, m.oil)
	}
	return m.f.BubblePointWith(rs, m.oil, c)
}

func (m pbModel) publishedRs(p float64, c []float64) (float64, error) {
	if c == nil || m.f.SolutionGORWith == nil {
		return m.f.SolutionGOR(p, m.oil)
	}
	return m.f.SolutionGORWith(p, m.oil, c)
}

// pb is the tuned bubble point of an oil holding r scf/STB.
func (m pbModel) pb(q Params, r float64) (float64, error) {
	if e := q.bend(); e != 1 && r != m.rsb {
		r = m.rsb * math.Pow(r/m.rsb, 1/e)
	}
	v, err := m.publishedPb(r, q.Coefficients)
	return q.Multiplier*v + q.Shift, err
}

// rs is the tuned solution GOR at p (not limited to Rsb: callers clamp).
func (m pbModel) rs(q Params, p float64) (float64, error) {
	pp := (p - q.Shift) / q.Multiplier
	if pp <= 0 {
		return 0, nil
	}
	v, err := m.publishedRs(pp, q.Coefficients)
	if err != nil {
		return 0, err
	}
	if e := q.bend(); e != 1 && v > 0 {
		v = m.rsb * math.Pow(v/m.rsb, e)
	}
	return v, nil
}

func (m pbModel) predict(q Params, pts []Point, out []float64) error {
	for i, pt := range pts {
		var v float64
		var err error
		if pt.Quantity == "Pb" {
			v, err = m.pb(q, pt.Rs)
		} else {
			v, err = m.rs(q, pt.Pressure)
		}
		if err != nil {
			return err
		}
		out[i] = v
	}
	return nil
}

// boModel: Bo_tuned = 1 + m·(Bo_c − 1) + s.
type boModel struct {
	f   correlations.OilFVFFamily
	oil correlations.Oil
}

func (m boModel) coefficients() []correlations.Coefficient { return m.f.Coefficients }

func (m boModel) value(c []float64, p, rs float64) (float64, error) {
	if c == nil || m.f.FVFWith == nil {
		return m.f.FVF(p, rs, m.oil)
	}
	return m.f.FVFWith(p, rs, m.oil, c)
}

func (m boModel) basis(c []float64, pts []Point, a, b []float64) error {
	for i, pt := range pts {
		v, err := m.value(c, pt.Pressure, pt.Rs)
		if err != nil {
			return err
		}
		a[i], b[i] = 1, v-1
	}
	return nil
}

// coModel predicts the average compressibility from the CCE's saturation pressure to p,
// −ln(V/Vsat)/(p − Psat); tuned: m·co_avg + s (s in 1/psi), equivalent to
// co_tuned(p) = m·co(p) + s pointwise.
type coModel struct {
	f       correlations.CompressibilityFamily
	oil     correlations.Oil
	pb, rsb float64
}

func (coModel) coefficients() []correlations.Coefficient { return nil }

func (m coModel) basis(_ []float64, pts []Point, a, b []float64) error {
	for i, pt := range pts {
		rv, err := m.f.RelativeVolume(pt.Pressure, m.pb, m.rsb, m.oil)
		if err != nil {
			return err
		}
		if rv <= 0 {
			return correlations.ErrNotFinite
		}
		a[i], b[i] = 0, -math.Log(rv)/(pt.Pressure-m.pb)
	}
	return nil
}

// muDeadModel: μod_tuned = m·μod + s.
type muDeadModel struct {
	f   correlations.DeadViscosityFamily
	oil correlations.Oil
}

func (m muDeadModel) coefficients() []correlations.Coefficient { return m.f.Coefficients }

func (m muDeadModel) value(c []float64) (float64, error) {
	if c == nil || m.f.ViscosityWith == nil {
		return m.f.Viscosity(m.oil)
	}
	return m.f.ViscosityWith(m.oil, c)
}

func (m muDeadModel) basis(c []float64, pts []Point, a, b []float64) error {
	v, err := m.value(c)
	if err != nil {
		return err
	}
	for i := range pts {
		a[i], b[i] = 0, v
	}
	return nil
}

// muSatModel: μ_tuned = m·μ(μod, Rs) + s, with μod the measured (or tuned) dead-oil viscosity.
type muSatModel struct {
	f      correlations.SatViscosityFamily
	oil    correlations.Oil
	muDead float64
}

func (m muSatModel) coefficients() []correlations.Coefficient { return m.f.Coefficients }

func (m muSatModel) value(c []float64, muDead, rs float64) (float64, error) {
	if c == nil || m.f.ViscosityWith == nil {
		return m.f.Viscosity(muDead, rs, m.oil)
	}
	return m.f.ViscosityWith(muDead, rs, m.oil, c)
}

func (m muSatModel) basis(c []float64, pts []Point, a, b []float64) error {
	for i, pt := range pts {
		v, err := m.value(c, m.muDead, pt.Rs)
		if err != nil {
			return err
		}
		a[i], b[i] = 0, v
	}
	return nil
}

// muUnderModel: μ_tuned = μb + m·(μ(p) − μ(Pb)) + s: a multiplier on the increase above Pb,
// so that μ stays continuous at Pb.
type muUnderModel struct {
	f      correlations.UnderViscosityFamily
	oil    correlations.Oil
	pb, mb float64
}

func (muUnderModel) coefficients() []correlations.Coefficient { return nil }

func (m muUnderModel) basis(_ []float64, pts []Point, a, b []float64) error {
	// Some published forms are not exactly μb at Pb (Kartoatmodjo–Schmidt: 1.00081·μb);
	// the increase is taken from the family's own value at Pb so the tuned curve is continuous.
	v0, err := m.f.Viscosity(m.pb, m.pb, m.mb, m.oil)
	if err != nil {
		return err
	}
	for i, pt := range pts {
		v, err := m.f.Viscosity(pt.Pressure, m.pb, m.mb, m.oil)
		if err != nil {
			return err
		}
		a[i], b[i] = m.mb, v-v0
	}
	return nil
}

// zModel: Z_tuned = 1 + m·(Z(Tpr, Ppr) − 1) + s: the multiplier acts on the departure from the
// ideal gas, so that without a shift the tuned Z still tends to 1 as the pressure falls (and
// Bg to the ideal-gas value). Pseudo-criticals from the gas gravity of each point with the
// Wichert–Aziz correction when the gas is sour.
type zModel struct {
	f        correlations.ZFamily
	pc       correlations.PseudoCriticalFamily
	tF       float64
	h2s, co2 float64
}

func (zModel) coefficients() []correlations.Coefficient { return nil }

func (m zModel) basis(_ []float64, pts []Point, a, b []float64) error {
	for i, pt := range pts {
		v, err := m.z(pt.Pressure, pt.GasGravity)
		if err != nil {
			return err
		}
		a[i], b[i] = 1, v-1
	}
	return nil
}

func (m zModel) z(p, gg float64) (float64, error) {
	ppc, tpc, err := m.pc.Critical(gg)
	if err != nil {
		return 0, err
	}
	if m.h2s > 0 || m.co2 > 0 {
		ppc, tpc, err = correlations.WichertAziz(ppc, tpc, m.h2s, m.co2)
		if err != nil {
			return 0, err
		}
	}
	return m.f.Z((m.tF+correlations.RankineOffset)/tpc, p/ppc)
}

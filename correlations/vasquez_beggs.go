package correlations

import (
	"fmt"
	"math"
)

// Vasquez and Beggs (1980): M. Vasquez and H.D. Beggs, "Correlations for Fluid Physical
// Property Prediction", J. Pet. Tech. 32 (June 1980) 968–970, SPE 6719. More than 6,000
// data points from about 600 laboratory analyses, split at 30 °API. All three correlations use
// the gas gravity normalised to a 100 psig (114.7 psia) first-stage separator:
//
//	γgs = γg·[1 + 5.912e−5 · API · Tsep · log10(psep/114.7)],
//
// psep psia and Tsep °F of the actual first stage (this is the form printed in the paper as it
// is commonly reproduced; it uses the separator temperature in °F). Unknown separator
// conditions (zero fields of Oil) default to 114.7 psia and 60 °F, which leaves γg unchanged.

// vbCoef holds one of the two coefficient sets (API ≤ 30, API > 30).
type vbCoef struct {
	c1, c2, c3 float64 // Rs = c1·γgs·p^c2·exp(c3·API/(T+459.67)); the paper writes T + 460
	b1, b2, b3 float64 // Bo = 1 + b1·Rs + b2·(T−60)·(API/γgs) + b3·Rs·(T−60)·(API/γgs)
}

var (
	vbHeavy = vbCoef{c1: 0.0362, c2: 1.0937, c3: 25.7240, b1: 4.677e-4, b2: 1.751e-5, b3: -1.811e-8}
	vbLight = vbCoef{c1: 0.0178, c2: 1.1870, c3: 23.931, b1: 4.670e-4, b2: 1.100e-5, b3: 1.337e-9}
)

func vbCoefs(api float64) *vbCoef {
	if api <= 30 {
		return &vbHeavy
	}
	return &vbLight
}

// VasquezBeggsGasGravity returns the separator gas gravity normalised to a 100 psig
// separator, γgs, from the first-stage separator gas gravity (o.SepGasGravity, else
// o.GasGravity) and the separator conditions of o (see the file comment).
func VasquezBeggsGasGravity(o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	return vbGasGravity(o)
}

func vbGasGravity(o Oil) (float64, error) {
	psep, tsep := sepConditions(o)
	g := o.firstStageGasGravity() * (1 + 5.912e-5*o.API*tsep*math.Log10(psep/114.7))
	if !(g > 0) {
		return 0, inputError("separator pressure", psep, "a value for which the normalised gas gravity stays > 0")
	}
	return g, nil
}

// VasquezBeggsSolutionGOR returns the solution GOR (scf/STB) at p psia (at or below the bubble
// point), Vasquez and Beggs (1980), the published direction:
//
//	Rs = C1·γgs·p^C2·exp[C3·API/(T + 459.67)],
//
// C1, C2, C3 = 0.0362, 1.0937, 25.7240 for API ≤ 30 and 0.0178, 1.1870, 23.931 above, T °F.
func VasquezBeggsSolutionGOR(p float64, o Oil) (float64, error) {
	return VasquezBeggsSolutionGORWith(p, o, vbPublished[:])
}

// VasquezBeggsCoefficients are the constants of the Vasquez–Beggs solution-gas pair that a
// refit may change, both sets (the oil's API picks one): Rs = C1·γgs·p^C2·exp(C3·API/(T+459.67)).
var VasquezBeggsCoefficients = []Coefficient{
	{ID: "c2_heavy", Value: vbHeavy.c2, Role: "C2 = 1.0937, the exponent of p (API ≤ 30)"},
	{ID: "c2_light", Value: vbLight.c2, Role: "C2 = 1.1870, the exponent of p (API > 30)"},
	{ID: "c1_heavy", Value: vbHeavy.c1, Role: "C1 = 0.0362 (API ≤ 30)"},
	{ID: "c1_light", Value: vbLight.c1, Role: "C1 = 0.0178 (API > 30)"},
	{ID: "c3_heavy", Value: vbHeavy.c3, Role: "C3 = 25.7240 (API ≤ 30)"},
	{ID: "c3_light", Value: vbLight.c3, Role: "C3 = 23.931 (API > 30)"},
}

var vbPublished = [6]float64{vbHeavy.c2, vbLight.c2, vbHeavy.c1, vbLight.c1, vbHeavy.c3, vbLight.c3}

// vbRsCoefs returns C1, C2, C3 of the oil's API class from a VasquezBeggsCoefficients vector.
func vbRsCoefs(api float64, c []float64) (c1, c2, c3 float64) {
	if api <= 30 {
		return c[2], c[0], c[4]
	}
	return c[3], c[1], c[5]
}

// VasquezBeggsSolutionGORWith is VasquezBeggsSolutionGOR with the coefficients c
// (VasquezBeggsCoefficients order).
func VasquezBeggsSolutionGORWith(p float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 6); err != nil {
		return 0, err
	}
	g, err := vbGasGravity(o)
	if err != nil {
		return 0, err
	}
	c1, c2, c3 := vbRsCoefs(o.API, c)
	return finite(c1 * g * pow(p, c2) * math.Exp(c3*o.API/(o.Temperature+rankine)))
}

// VasquezBeggsBubblePoint returns the bubble-point pressure (psia) for rsb scf/STB, the
// closed-form inverse of VasquezBeggsSolutionGOR:
//
//	Pb = [Rsb / (C1·γgs·exp(C3·API/(T + 459.67)))]^(1/C2).
func VasquezBeggsBubblePoint(rsb float64, o Oil) (float64, error) {
	return VasquezBeggsBubblePointWith(rsb, o, vbPublished[:])
}

// VasquezBeggsBubblePointWith is VasquezBeggsBubblePoint with the coefficients c
// (VasquezBeggsCoefficients order), the inverse of VasquezBeggsSolutionGORWith.
func VasquezBeggsBubblePointWith(rsb float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 6); err != nil {
		return 0, err
	}
	g, err := vbGasGravity(o)
	if err != nil {
		return 0, err
	}
	c1, c2, c3 := vbRsCoefs(o.API, c)
	return finite(pow(rsb/(c1*g*math.Exp(c3*o.API/(o.Temperature+rankine))), 1/c2))
}

// VasquezBeggsOilFVF returns the saturated oil formation volume factor (rb/STB), Vasquez and
// Beggs (1980):
//
//	Bo = 1 + C1·Rs + C2·(T − 60)·(API/γgs) + C3·Rs·(T − 60)·(API/γgs),
//
// C1, C2, C3 = 4.677e−4, 1.751e−5, −1.811e−8 for API ≤ 30 and 4.670e−4, 1.100e−5, 1.337e−9
// above, T °F. p is not used. With the API ≤ 30 set, C2 + C3·Rs < 0 above Rs ≈ 967 scf/STB,
// so there Bo falls with temperature: a property of the published fit.
func VasquezBeggsOilFVF(p, rs float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	g, err := vbGasGravity(o)
	if err != nil {
		return 0, err
	}
	k := vbCoefs(o.API)
	u := (o.Temperature - 60) * o.API / g
	return finite(1 + k.b1*rs + k.b2*u + k.b3*rs*u)
}

// vbCoNumerator returns 1e−5·(−1433 + 5·Rsb + 17.2·T − 1180·γgs + 12.61·API), so that
// co = A/p.
func vbCoNumerator(rsb float64, o Oil) (float64, error) {
	g, err := vbGasGravity(o)
	if err != nil {
		return 0, err
	}
	a := 1e-5 * (-1433 + 5*rsb + 17.2*o.Temperature - 1180*g + 12.61*o.API)
	if !(a > 0) {
		// Heavy, gas-poor oils outside the data give a negative compressibility.
		return 0, fmt.Errorf("%w: Vasquez–Beggs co is not positive for Rsb = %g scf/STB, T = %g °F, API = %g",
			ErrInput, rsb, o.Temperature, o.API)
	}
	return a, nil
}

func checkUndersaturated(p, pb, rsb float64) error {
	if err := checkPressure("p", p); err != nil {
		return err
	}
	if err := checkPressure("Pb", pb); err != nil {
		return err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return err
	}
	if p < pb {
		return inputError("p", p, fmt.Sprintf("≥ Pb = %g psia (undersaturated oil)", pb))
	}
	return nil
}

// VasquezBeggsCo returns the undersaturated oil compressibility (1/psi) at p ≥ pb, Vasquez
// and Beggs (1980):
//
//	co = (−1433 + 5·Rsb + 17.2·T − 1180·γgs + 12.61·API) / (1e5·p),
//
// T °F. Fitted to 4,036 points, p 126–9,500 psia (from memory). A non-positive numerator
// (heavy, gas-poor oils far outside the data) is refused with ErrInput.
func VasquezBeggsCo(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkUndersaturated(p, pb, rsb); err != nil {
		return 0, err
	}
	a, err := vbCoNumerator(rsb, o)
	if err != nil {
		return 0, err
	}
	return finite(a / p)
}

// VasquezBeggsRelativeVolume returns Bo(p)/Bo(pb) for p ≥ pb from the integral of
// VasquezBeggsCo in closed form: ∫co dp = A·ln(p/pb), so Bo/Bob = (pb/p)^A.
func VasquezBeggsRelativeVolume(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkUndersaturated(p, pb, rsb); err != nil {
		return 0, err
	}
	a, err := vbCoNumerator(rsb, o)
	if err != nil {
		return 0, err
	}
	return finite(math.Exp(-a * math.Log(p/pb)))
}

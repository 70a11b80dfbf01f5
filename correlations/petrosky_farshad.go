package correlations

import "math"

// Petrosky and Farshad (1993): G.E. Petrosky Jr. and F.F. Farshad, "Pressure-Volume-Temperature
// Correlations for Gulf of Mexico Crude Oils", SPE 26644, SPE Annual Technical Conference,
// Houston (1993). 81 Gulf of Mexico oils: Pb 1,574–6,523 psia, T 114–288 °F, Rsb 217–1,406
// scf/STB, 16.3–45.0 °API, γg 0.578–0.852; co data p 1,700–10,692 psia (from memory).
// Temperatures in °F.

func pfX(o Oil) float64 {
	return 7.916e-4*pow(o.API, 1.5410) - 4.561e-5*pow(o.Temperature, 1.3911)
}

// PetroskyFarshadBubblePoint returns the bubble-point pressure (psia), Petrosky and Farshad
// (1993), published direction:
//
//	Pb = 112.727·[Rsb^0.577421 / (γg^0.8439 · 10^X) − 12.340],
//	X = 7.916e−4·API^1.5410 − 4.561e−5·T^1.3911.
//
// Because of the −12.340 the published form reaches Pb = 0 at a positive Rsb (50–100 scf/STB
// for heavy oils); below standard pressure (14.7 psia) the pair is continued linearly through
// the origin, Pb = 14.7·Rsb/Rs(14.7), so that it stays positive, monotonic and exactly inverse.
func PetroskyFarshadBubblePoint(rsb float64, o Oil) (float64, error) {
	return PetroskyFarshadBubblePointWith(rsb, o, pfPublished[:])
}

// PetroskyFarshadCoefficients are the constants of the Petrosky–Farshad solution-gas pair that
// a refit may change: Pb = scale·[Rsb^exponent/(γg^0.8439·10^X) − offset].
var PetroskyFarshadCoefficients = []Coefficient{
	{ID: "offset", Value: 12.340, Role: "12.340 in [… − 12.340]"},
	{ID: "exponent", Value: 0.577421, Role: "0.577421, the exponent of Rsb"},
	{ID: "scale", Value: 112.727, Role: "112.727, the pressure scale"},
}

var pfPublished = [3]float64{12.340, 0.577421, 112.727}

// PetroskyFarshadBubblePointWith is PetroskyFarshadBubblePoint with the coefficients c
// (PetroskyFarshadCoefficients order).
func PetroskyFarshadBubblePointWith(rsb float64, o Oil, c []float64) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 3); err != nil {
		return 0, err
	}
	x := pfX(o)
	pb := c[2] * (pow(rsb, c[1])/(pow(o.GasGravity, 0.8439)*pow10(x)) - c[0])
	if pb < pLinear { // equivalent to rsb < Rs(14.7), the published form being monotonic
		return finite(pLinear * rsb / pfRs(pLinear, o, x, c))
	}
	return finite(pb)
}

func pfRs(p float64, o Oil, x float64, c []float64) float64 {
	return pow((p/c[2]+c[0])*pow(o.GasGravity, 0.8439)*pow10(x), 1/c[1])
}

// PetroskyFarshadSolutionGOR returns the solution GOR (scf/STB) at p psia, the closed-form
// inverse of PetroskyFarshadBubblePoint:
//
//	Rs = [(p/112.727 + 12.340) · γg^0.8439 · 10^X]^(1/0.577421),
//
// continued linearly to Rs = 0 at p = 0 below 14.7 psia (see PetroskyFarshadBubblePoint).
func PetroskyFarshadSolutionGOR(p float64, o Oil) (float64, error) {
	return PetroskyFarshadSolutionGORWith(p, o, pfPublished[:])
}

// PetroskyFarshadSolutionGORWith is PetroskyFarshadSolutionGOR with the coefficients c
// (PetroskyFarshadCoefficients order).
func PetroskyFarshadSolutionGORWith(p float64, o Oil, c []float64) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 3); err != nil {
		return 0, err
	}
	x := pfX(o)
	if p < pLinear {
		return finite(pfRs(pLinear, o, x, c) * p / pLinear)
	}
	return finite(pfRs(p, o, x, c))
}

// PetroskyFarshadOilFVF returns the saturated oil formation volume factor (rb/STB), Petrosky
// and Farshad (1993):
//
//	Bo = 1.0113 + 7.2046e−5·[Rs^0.3738 · γg^0.2914 / γo^0.6265 + 0.24626·T^0.5371]^3.0936.
//
// Data Bob 1.118–1.623 rb/STB. p is not used.
func PetroskyFarshadOilFVF(p, rs float64, o Oil) (float64, error) {
	return PetroskyFarshadOilFVFWith(p, rs, o, pfFVFPublished[:])
}

// PetroskyFarshadFVFCoefficients are the constants of the Petrosky–Farshad Bo that a refit may
// change: Bo = a + b·[Rs^e·γg^0.2914/γo^0.6265 + t·T^0.5371]^n.
var PetroskyFarshadFVFCoefficients = []Coefficient{
	{ID: "n", Value: 3.0936, Role: "3.0936, the outer exponent"},
	{ID: "t", Value: 0.24626, Role: "0.24626, the factor of T^0.5371"},
	{ID: "e", Value: 0.3738, Role: "0.3738, the exponent of Rs"},
	{ID: "a", Value: 1.0113, Role: "1.0113"},
	{ID: "b", Value: 7.2046e-5, Role: "7.2046e−5"},
}

var pfFVFPublished = [5]float64{3.0936, 0.24626, 0.3738, 1.0113, 7.2046e-5}

// PetroskyFarshadOilFVFWith is PetroskyFarshadOilFVF with the coefficients c
// (PetroskyFarshadFVFCoefficients order).
func PetroskyFarshadOilFVFWith(p, rs float64, o Oil, c []float64) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 5); err != nil {
		return 0, err
	}
	f := pow(rs, c[2])*pow(o.GasGravity, 0.2914)/pow(o.OilGravity(), 0.6265) +
		c[1]*pow(o.Temperature, 0.5371)
	return finite(c[3] + c[4]*pow(f, c[0]))
}

// pfCoFactor returns A = 1.705e−7 · Rsb^0.69357 · γg^0.1885 · API^0.3272 · T^0.6729, so that
// co = A·p^−0.5906.
func pfCoFactor(rsb float64, o Oil) float64 {
	return 1.705e-7 * math.Exp(0.69357*math.Log(rsb)+0.1885*math.Log(o.GasGravity)+
		0.3272*math.Log(o.API)+0.6729*math.Log(o.Temperature))
}

// checkPFCo validates the inputs of the Petrosky–Farshad compressibility: an undersaturated
// state and Rsb > 0 (co is a power of Rsb, zero for dead oil).
func checkPFCo(p, pb, rsb float64, o Oil) error {
	if err := checkOilPositiveT(o); err != nil {
		return err
	}
	if err := checkUndersaturated(p, pb, rsb); err != nil {
		return err
	}
	if !(rsb > 0) {
		return inputError("Rsb", rsb, "> 0 scf/STB: the correlation gives no compressibility for dead oil")
	}
	return nil
}

// PetroskyFarshadCo returns the undersaturated oil compressibility (1/psi) at p ≥ pb,
// Petrosky and Farshad (1993):
//
//	co = 1.705e−7 · Rsb^0.69357 · γg^0.1885 · API^0.3272 · T^0.6729 · p^−0.5906,  T °F.
func PetroskyFarshadCo(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkPFCo(p, pb, rsb, o); err != nil {
		return 0, err
	}
	return finite(pfCoFactor(rsb, o) * pow(p, -0.5906))
}

// PetroskyFarshadRelativeVolume returns Bo(p)/Bo(pb) for p ≥ pb from PetroskyFarshadCo
// integrated in closed form: ∫co dp = A/0.4094 · (p^0.4094 − pb^0.4094).
func PetroskyFarshadRelativeVolume(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkPFCo(p, pb, rsb, o); err != nil {
		return 0, err
	}
	const e = 1 - 0.5906
	integral := pfCoFactor(rsb, o) / e * (pow(p, e) - pow(pb, e))
	return finite(math.Exp(-integral))
}

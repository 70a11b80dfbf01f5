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
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	x := pfX(o)
	pb := 112.727 * (pow(rsb, 0.577421)/(pow(o.GasGravity, 0.8439)*pow10(x)) - 12.340)
	if pb < pLinear { // equivalent to rsb < Rs(14.7), the published form being monotonic
		return finite(pLinear * rsb / pfRs(pLinear, o, x))
	}
	return finite(pb)
}

func pfRs(p float64, o Oil, x float64) float64 {
	return pow((p/112.727+12.340)*pow(o.GasGravity, 0.8439)*pow10(x), 1/0.577421)
}

// PetroskyFarshadSolutionGOR returns the solution GOR (scf/STB) at p psia, the closed-form
// inverse of PetroskyFarshadBubblePoint:
//
//	Rs = [(p/112.727 + 12.340) · γg^0.8439 · 10^X]^(1/0.577421),
//
// continued linearly to Rs = 0 at p = 0 below 14.7 psia (see PetroskyFarshadBubblePoint).
func PetroskyFarshadSolutionGOR(p float64, o Oil) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	x := pfX(o)
	if p < pLinear {
		return finite(pfRs(pLinear, o, x) * p / pLinear)
	}
	return finite(pfRs(p, o, x))
}

// PetroskyFarshadOilFVF returns the saturated oil formation volume factor (rb/STB), Petrosky
// and Farshad (1993):
//
//	Bo = 1.0113 + 7.2046e−5·[Rs^0.3738 · γg^0.2914 / γo^0.6265 + 0.24626·T^0.5371]^3.0936.
//
// Data Bob 1.118–1.623 rb/STB. p is not used.
func PetroskyFarshadOilFVF(p, rs float64, o Oil) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	f := pow(rs, 0.3738)*pow(o.GasGravity, 0.2914)/pow(o.OilGravity(), 0.6265) +
		0.24626*pow(o.Temperature, 0.5371)
	return finite(1.0113 + 7.2046e-5*pow(f, 3.0936))
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

package correlations

import (
	"math"
)

// Glasø (1980): Ø. Glasø, "Generalized Pressure-Volume-Temperature Correlations", J. Pet. Tech.
// 32 (May 1980) 785–795, SPE 8016. 45 North Sea oil samples: Pb 165–7,142 psia, T 80–280 °F,
// Rsb 90–2,637 scf/STB, 22.3–48.1 °API, γg 0.650–1.276 (ranges from memory).

// GlasoBubblePoint returns the bubble-point pressure (psia), Glasø (1980), published
// direction:
//
//	log Pb = 1.7669 + 1.7447·log Pb* − 0.30218·(log Pb*)²,  Pb* = (Rsb/γg)^0.816 · T^0.172 / API^0.989,
//
// T °F, logarithms base 10 (the paper's paraffinicity exponent 0.989 for "normal" oils; no
// correction for non-hydrocarbons). Rsb beyond the maximum of the quadratic is refused.
func GlasoBubblePoint(rsb float64, o Oil) (float64, error) {
	return GlasoBubblePointWith(rsb, o, glasoPublished[:])
}

// GlasoCoefficients are the constants of the Glasø solution-gas pair that a refit may change:
// log Pb = a + b·x − c·x², x = log[(Rsb/γg)^d · T^0.172 / API^0.989].
var GlasoCoefficients = []Coefficient{
	{ID: "b", Value: 1.7447, Role: "1.7447, the linear term of the log-quadratic"},
	{ID: "c", Value: 0.30218, Role: "0.30218, the quadratic term"},
	{ID: "d", Value: 0.816, Role: "0.816, the exponent of Rsb/γg"},
	{ID: "a", Value: 1.7669, Role: "1.7669, the constant term"},
}

var glasoPublished = [4]float64{1.7447, 0.30218, 0.816, 1.7669}

// GlasoBubblePointWith is GlasoBubblePoint with the coefficients c (GlasoCoefficients order).
func GlasoBubblePointWith(rsb float64, o Oil, c []float64) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 4); err != nil {
		return 0, err
	}
	if rsb == 0 {
		return 0, inputError("Rsb", rsb, "> 0 for Glasø's logarithmic form")
	}
	b, cc, d, a := c[0], c[1], c[2], c[3]
	x := math.Log10(pow(rsb/o.GasGravity, d) * pow(o.Temperature, 0.172) / pow(o.API, 0.989))
	if !(cc > 0) || x > b/(2*cc) {
		return 0, inputError("Rsb", rsb, "below the maximum of Glasø's log-quadratic (Pb < about 19,300 psia)")
	}
	return finite(pow10(a + b*x - cc*x*x))
}

// GlasoSolutionGOR returns the solution GOR (scf/STB) at p psia as the closed-form inverse of
// GlasoBubblePoint, solving the quadratic for log Pb* on its rising branch:
//
//	log Pb* = 2.8869 − (14.1811 − 3.3093·log p)^0.5,  Rs = γg·[Pb* · API^0.989 / T^0.172]^(1/0.816),
//
// with the constants computed from the Pb coefficients rather than the rounded printed ones,
// so that the pair is exactly inverse. p above about 19,300 psia is refused.
func GlasoSolutionGOR(p float64, o Oil) (float64, error) {
	return GlasoSolutionGORWith(p, o, glasoPublished[:])
}

// GlasoSolutionGORWith is GlasoSolutionGOR with the coefficients c (GlasoCoefficients order).
func GlasoSolutionGORWith(p float64, o Oil, cf []float64) (float64, error) {
	if err := checkOilPositiveT(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkCoefficients(cf, 4); err != nil {
		return 0, err
	}
	a, b, c, d := -cf[1], cf[0], cf[3], cf[2]
	disc := b*b - 4*a*(c-math.Log10(p))
	if disc < 0 || !(a < 0) {
		return 0, inputError("p", p, "below the maximum of Glasø's log-quadratic (about 19,300 psia)")
	}
	// Rising branch, x ≤ b/(−2a), written without cancellation near log p = c.
	x := 2 * (math.Log10(p) - c) / (b + math.Sqrt(disc))
	pbStar := pow10(x)
	rs := o.GasGravity * pow(pbStar*pow(o.API, 0.989)/pow(o.Temperature, 0.172), 1/d)
	return finite(rs)
}

// GlasoOilFVF returns the saturated oil formation volume factor (rb/STB), Glasø (1980):
//
//	log(Bo − 1) = −6.58511 + 2.91329·log Bo* − 0.27683·(log Bo*)²,  Bo* = Rs·(γg/γo)^0.526 + 0.968·T,
//
// T °F, logarithms base 10. Data Bob 1.087–2.588 rb/STB (from memory). p is not used.
func GlasoOilFVF(p, rs float64, o Oil) (float64, error) {
	return GlasoOilFVFWith(p, rs, o, glasoFVFPublished[:])
}

// GlasoFVFCoefficients are the constants of Glasø's Bo that a refit may change:
// log(Bo − 1) = a + b·x − c·x², x = log[Rs·(γg/γo)^0.526 + t·T].
var GlasoFVFCoefficients = []Coefficient{
	{ID: "c", Value: 0.27683, Role: "0.27683, the quadratic term"},
	{ID: "t", Value: 0.968, Role: "0.968, the factor of T in Bo*"},
	{ID: "b", Value: 2.91329, Role: "2.91329, the linear term"},
	{ID: "a", Value: -6.58511, Role: "−6.58511, the constant term"},
}

var glasoFVFPublished = [4]float64{0.27683, 0.968, 2.91329, -6.58511}

// GlasoOilFVFWith is GlasoOilFVF with the coefficients c (GlasoFVFCoefficients order).
func GlasoOilFVFWith(p, rs float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 4); err != nil {
		return 0, err
	}
	f := rs*pow(o.GasGravity/o.OilGravity(), 0.526) + c[1]*o.Temperature
	if !(f > 0) {
		return 0, inputError("temperature", o.Temperature, "high enough for a positive Glasø correlating number")
	}
	x := math.Log10(f)
	return finite(1 + pow10(c[3]+c[2]*x-c[0]*x*x))
}

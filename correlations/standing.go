package correlations

// Standing (1947): M.B. Standing, "A Pressure-Volume-Temperature Correlation for Mixtures of
// California Oils and Gases", Drilling and Production Practice, API (1947), 275–287. Fitted to
// 105 bubble points of 22 California oil–gas systems: Pb 130–7,000 psia, T 100–258 °F,
// Rsb 20–1,425 scf/STB, 16.5–63.8 °API, γg 0.59–0.95 (ranges from memory, as commonly quoted).

// StandingBubblePoint returns the bubble-point pressure (psia) of an oil holding rsb scf/STB,
// by Standing (1947) in its usual algebraic form
//
//	Pb = 18.2·[(Rsb/γg)^0.83 · 10^a − 1.4],  a = 0.00091·T − 0.0125·API,
//
// T in °F. This is the published direction. Because of the −1.4 the published form reaches
// Pb = 0 at a small positive Rsb; below standard pressure (14.7 psia) the pair is continued
// linearly through the origin, Pb = 14.7·Rsb/Rs(14.7), so that it stays positive, monotonic and
// exactly inverse.
func StandingBubblePoint(rsb float64, o Oil) (float64, error) {
	return StandingBubblePointWith(rsb, o, standingPublished[:])
}

// StandingCoefficients are the constants of the Standing pair that a refit may change, in the
// order of the With functions: Rs = γg·[(p/scale + offset)·10^x]^exponent.
var StandingCoefficients = []Coefficient{
	{ID: "scale", Value: 18.2, Role: "18.2 in p/18.2"},
	{ID: "offset", Value: 1.4, Role: "1.4 in (p/18.2 + 1.4)"},
	{ID: "exponent", Value: 1 / 0.83, Role: "1/0.83 = 1.2048, the exponent of the pressure term in Rs"},
}

var standingPublished = [3]float64{18.2, 1.4, 1 / 0.83}

// StandingBubblePointWith is StandingBubblePoint with the coefficients c (StandingCoefficients
// order), the inverse of StandingSolutionGORWith.
func StandingBubblePointWith(rsb float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 3); err != nil {
		return 0, err
	}
	a := 0.00091*o.Temperature - 0.0125*o.API
	pb := c[0] * (pow(rsb/o.GasGravity, 1/c[2])*pow10(a) - c[1])
	if pb < pLinear { // equivalent to rsb < Rs(14.7), the published form being monotonic
		return finite(pLinear * rsb / standingRs(pLinear, o, c))
	}
	return finite(pb)
}

// pLinear is the pressure (psia, standard pressure) below which the Standing and
// Petrosky–Farshad pairs are continued linearly through the origin.
const pLinear = 14.7

func standingRs(p float64, o Oil, c []float64) float64 {
	x := 0.0125*o.API - 0.00091*o.Temperature
	return o.GasGravity * pow((p/c[0]+c[1])*pow10(x), c[2])
}

// StandingSolutionGOR returns the solution GOR (scf/STB) at p psia (p at or below the bubble
// point) as the closed-form inverse of StandingBubblePoint:
//
//	Rs = γg·[(p/18.2 + 1.4) · 10^(0.0125·API − 0.00091·T)]^(1/0.83),
//
// continued linearly to Rs = 0 at p = 0 below 14.7 psia (see StandingBubblePoint).
func StandingSolutionGOR(p float64, o Oil) (float64, error) {
	return StandingSolutionGORWith(p, o, standingPublished[:])
}

// StandingSolutionGORWith is StandingSolutionGOR with the coefficients c (StandingCoefficients
// order).
func StandingSolutionGORWith(p float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 3); err != nil {
		return 0, err
	}
	if p < pLinear {
		return finite(standingRs(pLinear, o, c) * p / pLinear)
	}
	return finite(standingRs(p, o, c))
}

// StandingOilFVF returns the saturated oil formation volume factor (rb/STB) of oil holding rs
// scf/STB at o.Temperature, by Standing (1947) in its original form
//
//	Bo = 0.9759 + 1.2e−4·F^1.2,  F = Rs·(γg/γo)^0.5 + 1.25·T,
//
// T in °F, γo the stock-tank oil specific gravity. (A later refit, 0.972 + 1.47e−4·F^1.175,
// is not this catalog entry.) Data: Bob 1.024–2.15 rb/STB. p is not used.
func StandingOilFVF(p, rs float64, o Oil) (float64, error) {
	return StandingOilFVFWith(p, rs, o, standingFVFPublished[:])
}

// StandingFVFCoefficients are the constants of Standing's Bo that a refit may change:
// Bo = intercept + slope·F^exponent, F = Rs·(γg/γo)^gravity + temperature·T. The ones that
// bend the curve come first.
var StandingFVFCoefficients = []Coefficient{
	{ID: "exponent", Value: 1.2, Role: "1.2, the exponent of F"},
	{ID: "temperature", Value: 1.25, Role: "1.25, the factor of T in F"},
	{ID: "gravity", Value: 0.5, Role: "0.5, the exponent of γg/γo in F"},
	{ID: "intercept", Value: 0.9759, Role: "0.9759"},
	{ID: "slope", Value: 1.2e-4, Role: "1.2e−4, the factor of F^1.2"},
}

var standingFVFPublished = [5]float64{1.2, 1.25, 0.5, 0.9759, 1.2e-4}

// StandingOilFVFWith is StandingOilFVF with the coefficients c (StandingFVFCoefficients order).
func StandingOilFVFWith(p, rs float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 5); err != nil {
		return 0, err
	}
	f := rs*pow(o.GasGravity/o.OilGravity(), c[2]) + c[1]*o.Temperature
	if !(f > 0) {
		return 0, inputError("temperature", o.Temperature, "high enough for a positive Standing correlating number")
	}
	return finite(c[3] + c[4]*pow(f, c[0]))
}

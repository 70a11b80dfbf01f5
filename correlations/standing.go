package correlations

import (
	"math"
)

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
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	a := 0.00091*o.Temperature - 0.0125*o.API
	pb := 18.2 * (pow(rsb/o.GasGravity, 0.83)*pow10(a) - 1.4)
	if pb < pLinear { // equivalent to rsb < Rs(14.7), the published form being monotonic
		return finite(pLinear * rsb / standingRs(pLinear, o))
	}
	return finite(pb)
}

// pLinear is the pressure (psia, standard pressure) below which the Standing and
// Petrosky–Farshad pairs are continued linearly through the origin.
const pLinear = 14.7

func standingRs(p float64, o Oil) float64 {
	x := 0.0125*o.API - 0.00091*o.Temperature
	return o.GasGravity * pow((p/18.2+1.4)*pow10(x), 1/0.83)
}

// StandingSolutionGOR returns the solution GOR (scf/STB) at p psia (p at or below the bubble
// point) as the closed-form inverse of StandingBubblePoint:
//
//	Rs = γg·[(p/18.2 + 1.4) · 10^(0.0125·API − 0.00091·T)]^(1/0.83),
//
// continued linearly to Rs = 0 at p = 0 below 14.7 psia (see StandingBubblePoint).
func StandingSolutionGOR(p float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if p < pLinear {
		return finite(standingRs(pLinear, o) * p / pLinear)
	}
	return finite(standingRs(p, o))
}

// StandingOilFVF returns the saturated oil formation volume factor (rb/STB) of oil holding rs
// scf/STB at o.Temperature, by Standing (1947) in its original form
//
//	Bo = 0.9759 + 1.2e−4·F^1.2,  F = Rs·(γg/γo)^0.5 + 1.25·T,
//
// T in °F, γo the stock-tank oil specific gravity. (A later refit, 0.972 + 1.47e−4·F^1.175,
// is not this catalog entry.) Data: Bob 1.024–2.15 rb/STB. p is not used.
func StandingOilFVF(p, rs float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	f := rs*math.Sqrt(o.GasGravity/o.OilGravity()) + 1.25*o.Temperature
	if !(f > 0) {
		return 0, inputError("temperature", o.Temperature, "high enough for a positive Standing correlating number")
	}
	return finite(0.9759 + 1.2e-4*pow(f, 1.2))
}

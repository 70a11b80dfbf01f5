package correlations

import (
	"fmt"
	"math"
)

func checkSat(muDead, rs float64) error {
	if !(muDead > 0 && muDead <= 1e6) {
		return inputError("mu_dead", muDead, "0 < μod ≤ 1e6 cP")
	}
	if !(rs >= 0 && rs <= 1e4) {
		return inputError("Rs", rs, "0 ≤ Rs ≤ 10000 scf/STB")
	}
	return nil
}

func checkUnder(p, pb, muB float64) error {
	if err := checkPressure("pb", pb); err != nil {
		return err
	}
	if err := checkPressure("p", p); err != nil {
		return err
	}
	if p < pb {
		return inputError("p", p, fmt.Sprintf("p ≥ Pb = %g psia (undersaturated oil)", pb))
	}
	if !(muB > 0 && muB <= 1e6) {
		return inputError("mu at Pb", muB, "0 < μob ≤ 1e6 cP")
	}
	return nil
}

// ChewConnallySatViscosity returns the viscosity in cP of a gas-saturated oil holding rs
// scf/STB whose dead-oil viscosity is muDead cP, after Chew, J. and Connally, C.A. Jr.
// (1959), "A Viscosity Correlation for Gas-Saturated Crude Oils", Trans. AIME 216: 23–25,
// μob = A·μod^B, with the usual fits of their chart:
//
//	A = 10^(Rs·(2.2e-7·Rs − 7.4e-4))
//	B = 0.68/10^(8.62e-5·Rs) + 0.25/10^(1.1e-3·Rs) + 0.062/10^(3.74e-3·Rs)
//
// 457 crude samples, Rs 51–3,544 scf/STB, μod 0.377–50 cP, 72–292 °F. A's exponent is a
// parabola with its minimum at Rs ≈ 1,680 scf/STB, so above that μob rises again with Rs.
func ChewConnallySatViscosity(muDead, rs float64, o Oil) (float64, error) {
	return ChewConnallySatViscosityWith(muDead, rs, o, chewConnallyPublished[:])
}

// ChewConnallyCoefficients are the constants of the Chew–Connally chart fits that a refit may
// change: A = 10^(Rs·(quad·Rs − lin)), B = b1/10^(k1·Rs) + b2/10^(k2·Rs) + b3/10^(k3·Rs).
var ChewConnallyCoefficients = []Coefficient{
	{ID: "lin", Value: 7.4e-4, Role: "7.4e−4, the linear term of log A"},
	{ID: "quad", Value: 2.2e-7, Role: "2.2e−7, the quadratic term of log A"},
	{ID: "b1", Value: 0.68, Role: "0.68, the first term of B"},
	{ID: "b2", Value: 0.25, Role: "0.25, the second term of B"},
	{ID: "b3", Value: 0.062, Role: "0.062, the third term of B"},
	{ID: "k1", Value: 8.62e-5, Role: "8.62e−5, the decay of B's first term with Rs"},
	{ID: "k2", Value: 1.1e-3, Role: "1.1e−3, the decay of B's second term"},
	{ID: "k3", Value: 3.74e-3, Role: "3.74e−3, the decay of B's third term"},
}

var chewConnallyPublished = [8]float64{7.4e-4, 2.2e-7, 0.68, 0.25, 0.062, 8.62e-5, 1.1e-3, 3.74e-3}

// ChewConnallySatViscosityWith is ChewConnallySatViscosity with the coefficients c
// (ChewConnallyCoefficients order).
func ChewConnallySatViscosityWith(muDead, rs float64, _ Oil, c []float64) (float64, error) {
	if err := checkSat(muDead, rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 8); err != nil {
		return 0, err
	}
	a := pow10(rs * (c[1]*rs - c[0]))
	b := c[2]/pow10(c[5]*rs) + c[3]/pow10(c[6]*rs) + c[4]/pow10(c[7]*rs)
	return positive("chew-connally", a*math.Pow(muDead, b))
}

// BeggsRobinsonSatViscosity returns the saturated (live) oil viscosity in cP, after Beggs,
// H.D. and Robinson, J.R. (1975), "Estimating the Viscosity of Crude Oil Systems", J. Petrol.
// Technol. 27 (9): 1140–1141:
//
//	μob = A·μod^B,  A = 10.715·(Rs + 100)^−0.515,  B = 5.44·(Rs + 150)^−0.338
//
// 2,073 live-oil observations, Rs 20–2,070 scf/STB, 16–58 °API, 70–295 °F, 15–5,265 psia.
func BeggsRobinsonSatViscosity(muDead, rs float64, o Oil) (float64, error) {
	return BeggsRobinsonSatViscosityWith(muDead, rs, o, beggsRobinsonSatPublished[:])
}

// BeggsRobinsonSatCoefficients are the constants of the Beggs–Robinson live-oil viscosity that
// a refit may change: A = a·(Rs + 100)^−a_exp, B = b·(Rs + 150)^−b_exp.
var BeggsRobinsonSatCoefficients = []Coefficient{
	{ID: "a_exp", Value: 0.515, Role: "0.515, the exponent of Rs + 100 in A"},
	{ID: "b_exp", Value: 0.338, Role: "0.338, the exponent of Rs + 150 in B"},
	{ID: "b", Value: 5.44, Role: "5.44, the factor of B"},
	{ID: "a", Value: 10.715, Role: "10.715, the factor of A"},
}

var beggsRobinsonSatPublished = [4]float64{0.515, 0.338, 5.44, 10.715}

// BeggsRobinsonSatViscosityWith is BeggsRobinsonSatViscosity with the coefficients c
// (BeggsRobinsonSatCoefficients order).
func BeggsRobinsonSatViscosityWith(muDead, rs float64, _ Oil, c []float64) (float64, error) {
	if err := checkSat(muDead, rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 4); err != nil {
		return 0, err
	}
	a := c[3] * math.Pow(rs+100, -c[0])
	b := c[2] * math.Pow(rs+150, -c[1])
	return positive("beggs-robinson", a*math.Pow(muDead, b))
}

// KartoatmodjoSchmidtSatViscosity returns the saturated oil viscosity in cP, after
// Kartoatmodjo, T. and Schmidt, Z. (1994), "Large Data Bank Improves Crude Physical Property
// Correlations", Oil and Gas Journal 92 (27): 51–55:
//
//	μob = −0.06821 + 0.9824·F + 0.0004034·F²
//	F   = (0.2001 + 0.8428·10^(−0.000845·Rs))·μod^(0.43 + 0.5165·y),  y = 10^(−0.00081·Rs)
//
// 5,321 points, Rs 0–2,890 scf/STB, μod 0.506–682 cP. For very light oils (μod below about
// 0.1 cP at high Rs) the intercept makes the result non-positive, which is reported as an
// error.
func KartoatmodjoSchmidtSatViscosity(muDead, rs float64, o Oil) (float64, error) {
	return KartoatmodjoSchmidtSatViscosityWith(muDead, rs, o, ksSatPublished[:])
}

// KartoatmodjoSchmidtSatCoefficients are the constants of F in the Kartoatmodjo–Schmidt
// live-oil viscosity that a refit may change (the outer quadratic in F stays as published):
// F = (f1 + f2·10^(−f3·Rs))·μod^(e1 + e2·10^(−e3·Rs)).
var KartoatmodjoSchmidtSatCoefficients = []Coefficient{
	{ID: "e1", Value: 0.43, Role: "0.43, the constant of the exponent of μod"},
	{ID: "e2", Value: 0.5165, Role: "0.5165, the Rs-dependent part of the exponent of μod"},
	{ID: "e3", Value: 0.00081, Role: "0.00081, its decay with Rs"},
	{ID: "f1", Value: 0.2001, Role: "0.2001, the constant of the factor"},
	{ID: "f2", Value: 0.8428, Role: "0.8428, the Rs-dependent part of the factor"},
	{ID: "f3", Value: 0.000845, Role: "0.000845, its decay with Rs"},
}

var ksSatPublished = [6]float64{0.43, 0.5165, 0.00081, 0.2001, 0.8428, 0.000845}

// KartoatmodjoSchmidtSatViscosityWith is KartoatmodjoSchmidtSatViscosity with the coefficients
// c (KartoatmodjoSchmidtSatCoefficients order).
func KartoatmodjoSchmidtSatViscosityWith(muDead, rs float64, _ Oil, c []float64) (float64, error) {
	if err := checkSat(muDead, rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 6); err != nil {
		return 0, err
	}
	y := pow10(-c[2] * rs)
	f := (c[3] + c[4]*pow10(-c[5]*rs)) * math.Pow(muDead, c[0]+c[1]*y)
	return positive("kartoatmodjo-schmidt", -0.06821+0.9824*f+0.0004034*f*f)
}

// PetroskyFarshadSatViscosity returns the saturated oil viscosity in cP, after Petrosky,
// G.E. Jr. and Farshad, F.F. (1995), "Viscosity Correlations for Gulf of Mexico Crude Oils",
// SPE 29468:
//
//	μob = A·μod^B,  A = 0.1651 + 0.6165·10^(−6.0866e-4·Rs),  B = 0.5131 + 0.5109·10^(−1.1831e-3·Rs)
//
// 864 points, Rs 21–1,885 scf/STB, μod 0.725–11.69 cP.
func PetroskyFarshadSatViscosity(muDead, rs float64, o Oil) (float64, error) {
	return PetroskyFarshadSatViscosityWith(muDead, rs, o, pfSatPublished[:])
}

// PetroskyFarshadSatCoefficients are the constants of the Petrosky–Farshad live-oil viscosity
// that a refit may change: A = a1 + a2·10^(−a3·Rs), B = b1 + b2·10^(−b3·Rs).
var PetroskyFarshadSatCoefficients = []Coefficient{
	{ID: "b1", Value: 0.5131, Role: "0.5131, the constant of B"},
	{ID: "b2", Value: 0.5109, Role: "0.5109, the Rs-dependent part of B"},
	{ID: "b3", Value: 1.1831e-3, Role: "1.1831e−3, its decay with Rs"},
	{ID: "a1", Value: 0.1651, Role: "0.1651, the constant of A"},
	{ID: "a2", Value: 0.6165, Role: "0.6165, the Rs-dependent part of A"},
	{ID: "a3", Value: 6.0866e-4, Role: "6.0866e−4, its decay with Rs"},
}

var pfSatPublished = [6]float64{0.5131, 0.5109, 1.1831e-3, 0.1651, 0.6165, 6.0866e-4}

// PetroskyFarshadSatViscosityWith is PetroskyFarshadSatViscosity with the coefficients c
// (PetroskyFarshadSatCoefficients order).
func PetroskyFarshadSatViscosityWith(muDead, rs float64, _ Oil, c []float64) (float64, error) {
	if err := checkSat(muDead, rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 6); err != nil {
		return 0, err
	}
	a := c[3] + c[4]*pow10(-c[5]*rs)
	b := c[0] + c[1]*pow10(-c[2]*rs)
	return positive("petrosky-farshad", a*math.Pow(muDead, b))
}

// VasquezBeggsUnderViscosity returns the viscosity in cP at p ≥ pb (psia) of an oil whose
// bubble-point viscosity is muB, after Vasquez, M. and Beggs, H.D. (1980), "Correlations
// for Fluid Physical Property Prediction", J. Petrol. Technol. 32 (6): 968–970 (SPE 6719):
//
//	μo = μob·(p/pb)^m,  m = 2.6·p^1.187·exp(−11.513 − 8.98e-5·p)
//
// About 600 laboratory PVT analyses, 141–9,515 psia, μo 0.117–148 cP.
func VasquezBeggsUnderViscosity(p, pb, muB float64, _ Oil) (float64, error) {
	if err := checkUnder(p, pb, muB); err != nil {
		return 0, err
	}
	m := 2.6 * math.Pow(p, 1.187) * math.Exp(-11.513-8.98e-5*p)
	return positive("vasquez-beggs", muB*math.Pow(p/pb, m))
}

// BealUnderViscosity returns the undersaturated oil viscosity in cP, after Beal (1946) as
// fitted by Standing (Volumetric and Phase Behavior of Oil Field Hydrocarbon Systems, SPE):
//
//	μo = μob + 0.001·(p − pb)·(0.024·μob^1.6 + 0.038·μob^0.56)
//
// 52 observations on 26 crudes, about 1,515–5,515 psia, μob 0.142–127 cP.
func BealUnderViscosity(p, pb, muB float64, _ Oil) (float64, error) {
	if err := checkUnder(p, pb, muB); err != nil {
		return 0, err
	}
	mu := muB + 0.001*(p-pb)*(0.024*math.Pow(muB, 1.6)+0.038*math.Pow(muB, 0.56))
	return positive("beal", mu)
}

// KartoatmodjoSchmidtUnderViscosity returns the undersaturated oil viscosity in cP, after
// Kartoatmodjo and Schmidt (1994), Oil and Gas Journal 92 (27): 51–55:
//
//	μo = 1.00081·μob + 0.001127·(p − pb)·(−0.006517·μob^1.8148 + 0.038·μob^1.59)
//
// 3,588 points, 24.7–6,014.7 psia, μob 0.168–184.86 cP. The bracket changes sign at
// μob ≈ 2,500 cP, beyond which the fit makes viscosity fall with pressure.
func KartoatmodjoSchmidtUnderViscosity(p, pb, muB float64, _ Oil) (float64, error) {
	if err := checkUnder(p, pb, muB); err != nil {
		return 0, err
	}
	mu := 1.00081*muB + 0.001127*(p-pb)*(-0.006517*math.Pow(muB, 1.8148)+0.038*math.Pow(muB, 1.59))
	return positive("kartoatmodjo-schmidt", mu)
}

// PetroskyFarshadUnderViscosity returns the undersaturated oil viscosity in cP, after
// Petrosky and Farshad (1995), SPE 29468, with L = log10(μob):
//
//	μo = μob + 1.3449e-3·(p − pb)·10^A,  A = −1.0146 + 1.3322·L − 0.4876·L² − 1.15036·L³
//
// 404 points, 1,600–10,250 psia, μob 0.211–3.546 cP.
func PetroskyFarshadUnderViscosity(p, pb, muB float64, _ Oil) (float64, error) {
	if err := checkUnder(p, pb, muB); err != nil {
		return 0, err
	}
	l := math.Log10(muB)
	a := -1.0146 + l*(1.3322+l*(-0.4876-1.15036*l))
	return positive("petrosky-farshad", muB+1.3449e-3*(p-pb)*pow10(a))
}

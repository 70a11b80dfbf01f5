package correlations

// Al-Marhoun (1988): M.A. Al-Marhoun, "PVT Correlations for Middle East Crude Oils", J. Pet.
// Tech. 40 (May 1988) 650–666, SPE 13718. 160 bubble points from 69 Middle East reservoirs:
// Pb 130–3,573 psia, T 74–240 °F, Rsb 26–1,602 scf/STB, 19.4–44.6 °API, γg 0.752–1.367.
// Temperatures in °R.

// AlMarhounBubblePoint returns the bubble-point pressure (psia), Al-Marhoun (1988),
// published direction:
//
//	Pb = 5.38088e−3 · Rsb^0.715082 · γg^−1.87784 · γo^3.1437 · T^1.32657,  T °R.
func AlMarhounBubblePoint(rsb float64, o Oil) (float64, error) {
	return AlMarhounBubblePointWith(rsb, o, alMarhounPublished[:])
}

// AlMarhounCoefficients are the constants of the Al-Marhoun solution-gas pair that a refit
// may change: Pb = a·Rsb^b·γg^−1.87784·γo^3.1437·T^1.32657.
var AlMarhounCoefficients = []Coefficient{
	{ID: "b", Value: 0.715082, Role: "0.715082, the exponent of Rsb"},
	{ID: "a", Value: 5.38088e-3, Role: "5.38088e−3, the factor"},
}

var alMarhounPublished = [2]float64{0.715082, 5.38088e-3}

func alMarhounFactor(o Oil, a float64) float64 {
	return a * pow(o.GasGravity, -1.87784) * pow(o.OilGravity(), 3.1437) * pow(o.Temperature+rankine, 1.32657)
}

// AlMarhounBubblePointWith is AlMarhounBubblePoint with the coefficients c
// (AlMarhounCoefficients order).
func AlMarhounBubblePointWith(rsb float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 2); err != nil {
		return 0, err
	}
	return finite(alMarhounFactor(o, c[1]) * pow(rsb, c[0]))
}

// AlMarhounSolutionGOR returns the solution GOR (scf/STB) at p psia, the closed-form inverse
// of AlMarhounBubblePoint:
//
//	Rs = [p / (5.38088e−3 · γg^−1.87784 · γo^3.1437 · T^1.32657)]^(1/0.715082).
func AlMarhounSolutionGOR(p float64, o Oil) (float64, error) {
	return AlMarhounSolutionGORWith(p, o, alMarhounPublished[:])
}

// AlMarhounSolutionGORWith is AlMarhounSolutionGOR with the coefficients c
// (AlMarhounCoefficients order).
func AlMarhounSolutionGORWith(p float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 2); err != nil {
		return 0, err
	}
	return finite(pow(p/alMarhounFactor(o, c[1]), 1/c[0]))
}

// AlMarhounOilFVF returns the saturated oil formation volume factor (rb/STB), Al-Marhoun
// (1988):
//
//	Bo = 0.497069 + 0.862963e−3·T + 0.182594e−2·F + 0.318099e−5·F²,
//	F = Rs^0.742390 · γg^0.323294 · γo^−1.202040,  T °R.
//
// Data Bob 1.032–1.997 rb/STB. p is not used.
func AlMarhounOilFVF(p, rs float64, o Oil) (float64, error) {
	return AlMarhounOilFVFWith(p, rs, o, alMarhounFVFPublished[:])
}

// AlMarhounFVFCoefficients are the constants of Al-Marhoun's Bo that a refit may change:
// Bo = a0 + a1·T + a2·F + a3·F², F = Rs^e·γg^0.323294·γo^−1.202040.
var AlMarhounFVFCoefficients = []Coefficient{
	{ID: "e", Value: 0.742390, Role: "0.742390, the exponent of Rs in F"},
	{ID: "a3", Value: 0.318099e-5, Role: "0.318099e−5, the factor of F²"},
	{ID: "a2", Value: 0.182594e-2, Role: "0.182594e−2, the factor of F"},
	{ID: "a1", Value: 0.862963e-3, Role: "0.862963e−3, the factor of T"},
	{ID: "a0", Value: 0.497069, Role: "0.497069"},
}

var alMarhounFVFPublished = [5]float64{0.742390, 0.318099e-5, 0.182594e-2, 0.862963e-3, 0.497069}

// AlMarhounOilFVFWith is AlMarhounOilFVF with the coefficients c (AlMarhounFVFCoefficients
// order).
func AlMarhounOilFVFWith(p, rs float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 5); err != nil {
		return 0, err
	}
	t := o.Temperature + rankine
	f := pow(rs, c[0]) * pow(o.GasGravity, 0.323294) * pow(o.OilGravity(), -1.202040)
	return finite(c[4] + c[3]*t + c[2]*f + c[1]*f*f)
}

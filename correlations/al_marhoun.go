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
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	t := o.Temperature + rankine
	pb := 5.38088e-3 * pow(rsb, 0.715082) * pow(o.GasGravity, -1.87784) *
		pow(o.OilGravity(), 3.1437) * pow(t, 1.32657)
	return finite(pb)
}

// AlMarhounSolutionGOR returns the solution GOR (scf/STB) at p psia, the closed-form inverse
// of AlMarhounBubblePoint:
//
//	Rs = [p / (5.38088e−3 · γg^−1.87784 · γo^3.1437 · T^1.32657)]^(1/0.715082).
func AlMarhounSolutionGOR(p float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	t := o.Temperature + rankine
	k := 5.38088e-3 * pow(o.GasGravity, -1.87784) * pow(o.OilGravity(), 3.1437) * pow(t, 1.32657)
	return finite(pow(p/k, 1/0.715082))
}

// AlMarhounOilFVF returns the saturated oil formation volume factor (rb/STB), Al-Marhoun
// (1988):
//
//	Bo = 0.497069 + 0.862963e−3·T + 0.182594e−2·F + 0.318099e−5·F²,
//	F = Rs^0.742390 · γg^0.323294 · γo^−1.202040,  T °R.
//
// Data Bob 1.032–1.997 rb/STB. p is not used.
func AlMarhounOilFVF(p, rs float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	t := o.Temperature + rankine
	f := pow(rs, 0.742390) * pow(o.GasGravity, 0.323294) * pow(o.OilGravity(), -1.202040)
	return finite(0.497069 + 0.862963e-3*t + 0.182594e-2*f + 0.318099e-5*f*f)
}

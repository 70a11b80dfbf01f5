package correlations

import "math"

// Lasater (1958): J.A. Lasater, "Bubble Point Pressure Correlation", Trans. AIME 213 (1958)
// 379–381. 158 bubble points of 137 oils from Canada, the western and mid-continent United
// States and South America: Pb 48–5,780 psia, T 82–272 °F, Rsb 3–2,905 scf/STB,
// 17.9–51.1 °API, γg 0.574–1.223 (from memory).
//
// Lasater correlated the bubble-point pressure factor pf = Pb·γg/T (T °R) with the mole
// fraction of gas in the reservoir liquid,
//
//	yg = (Rs/379.3) / (Rs/379.3 + 350·γo/Mo),
//
// on a chart. The code uses the common fit of that chart (yg ≤ 0.6: pf = 0.679·exp(2.786·yg)
// − 0.323; yg > 0.6: pf = 8.26·yg^3.56 + 1.95) and of the effective molecular weight chart of
// the stock-tank oil (API ≤ 40: Mo = 630 − 10·API; API > 40: Mo = 73,110·API^−1.562).

func lasaterMo(api float64) float64 {
	if api <= 40 {
		return 630 - 10*api
	}
	return 73110 * pow(api, -1.562)
}

// lasaterYgBreak is the mole fraction where the two chart fits meet; their values there,
// lasaterPfLow and lasaterPfHigh, differ by about 0.001 (a small gap, not an overlap).
const lasaterYgBreak = 0.6

// lasaterYgMax bounds the chart fit from above: as yg → 1 the fit gives a finite Pb for an
// infinite Rs, so beyond yg = 0.95 (Rs of about 5,000 scf/STB or more, far outside Lasater's
// data) Pb is continued in proportion to Rs.
const lasaterYgMax = 0.95

// lasaterYgMin bounds the chart fit from below: the fit gives pf = 0.356, not zero, at
// yg = 0 (the chart does not reach dead oil), so below yg = 0.05 (Rs of roughly 10–30
// scf/STB) Pb is continued in proportion to Rs down to zero, and low-pressure DL stages get
// a small Rs instead of none.
const lasaterYgMin = 0.05

var (
	lasaterPfMax  = 8.26*pow(lasaterYgMax, 3.56) + 1.95
	lasaterPfLow  = 0.679*math.Exp(2.786*lasaterYgBreak) - 0.323
	lasaterPfHigh = 8.26*pow(lasaterYgBreak, 3.56) + 1.95
	lasaterPfMin  = 0.679*math.Exp(2.786*lasaterYgMin) - 0.323 // pf at yg = 0.05
)

// The stock-tank molecular-weight fits stay positive for every API > 0 (630 − 10·API for
// API ≤ 40), so checkOil is all Lasater needs.
func checkLasater(o Oil) error { return checkOil(o) }

// LasaterBubblePoint returns the bubble-point pressure (psia), Lasater (1958), the published
// direction: Pb = pf(yg)·(T + 459.67)/γg with the chart fits above. Below yg = 0.05 and above
// yg = 0.95 Pb is continued in proportion to Rsb (see lasaterYgMin and lasaterYgMax).
func LasaterBubblePoint(rsb float64, o Oil) (float64, error) {
	if err := checkLasater(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	n := rsb / 379.3
	k := 350 * o.OilGravity() / lasaterMo(o.API) // stock-tank oil, lb-mol per STB
	yg := n / (n + k)
	tOverG := (o.Temperature + rankine) / o.GasGravity
	if yg > lasaterYgMax {
		rsHi := 379.3 * k * lasaterYgMax / (1 - lasaterYgMax)
		return finite(lasaterPfMax * tOverG * rsb / rsHi)
	}
	if yg < lasaterYgMin {
		rsLo := 379.3 * k * lasaterYgMin / (1 - lasaterYgMin)
		return finite(lasaterPfMin * tOverG * rsb / rsLo)
	}
	var pf float64
	if yg <= lasaterYgBreak {
		pf = 0.679*math.Exp(2.786*yg) - 0.323
	} else {
		pf = 8.26*pow(yg, 3.56) + 1.95
	}
	return finite(pf * tOverG)
}

// LasaterSolutionGOR returns the solution GOR (scf/STB) at p psia by inverting the chart fits
// of LasaterBubblePoint in closed form: pf = p·γg/T, then yg from the matching branch, then
// Rs = 379.3·(350·γo/Mo)·yg/(1 − yg). Pressures in the small gap between the branches map to
// yg = 0.6, and pressures below pf(0.05) or above pf(0.95) invert the proportional
// continuations, so the pair is exactly inverse for every Rsb > 0.
func LasaterSolutionGOR(p float64, o Oil) (float64, error) {
	if err := checkLasater(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	pf := p * o.GasGravity / (o.Temperature + rankine)
	k := 350 * o.OilGravity() / lasaterMo(o.API)
	if pf > lasaterPfMax {
		rsHi := 379.3 * k * lasaterYgMax / (1 - lasaterYgMax)
		return finite(rsHi * pf / lasaterPfMax)
	}
	var yg float64
	switch {
	case pf < lasaterPfMin:
		rsLo := 379.3 * k * lasaterYgMin / (1 - lasaterYgMin)
		return finite(rsLo * pf / lasaterPfMin)
	case pf <= lasaterPfLow:
		yg = math.Log((pf+0.323)/0.679) / 2.786
	case pf < lasaterPfHigh:
		yg = lasaterYgBreak
	default:
		yg = pow((pf-1.95)/8.26, 1/3.56)
	}
	return finite(379.3 * k * yg / (1 - yg))
}

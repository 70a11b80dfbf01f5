package correlations

import "math"

// Kartoatmodjo and Schmidt (1994): T. Kartoatmodjo and Z. Schmidt, "Large Data Bank Improves
// Crude Physical Property Correlations", Oil & Gas Journal 92 (4 July 1994) 51–55. 740 oils
// (5,392 points) from Indonesia, North and South America and the Middle East: Pb 14.7–6,055
// psia, T 75–320 °F, Rsb 0–2,890 scf/STB, 14.4–58.9 °API, γg 0.379–1.709 (from memory).
//
// The correlations use their own separator-gas normalisation to 100 psig:
//
//	γg100 = γg·[1 + 0.1595 · API^0.4078 · Tsep^−0.2466 · log10(psep/114.7)],
//
// psep psia, Tsep °F (> 0). Unknown separator conditions default to 114.7 psia and 60 °F.

type ksCoef struct{ c1, c2, c3, c4 float64 }

var (
	ksHeavy = ksCoef{c1: 0.05958, c2: 0.7972, c3: 13.1405, c4: 0.9986} // API ≤ 30
	ksLight = ksCoef{c1: 0.03150, c2: 0.7587, c3: 11.2895, c4: 0.9143} // API > 30
)

func ksGasGravity(o Oil) (float64, error) {
	psep, tsep := sepConditions(o)
	if !(tsep > 0) {
		return 0, inputError("separator temperature", tsep, "> 0 °F for the Kartoatmodjo–Schmidt normalisation")
	}
	if psep == defaultSepPressure {
		return o.firstStageGasGravity(), nil // log10(1) = 0: no correction
	}
	g := o.firstStageGasGravity() * (1 + 0.1595*math.Exp(0.4078*math.Log(o.API)-0.2466*math.Log(tsep))*math.Log10(psep/114.7))
	if !(g > 0) {
		return 0, inputError("separator pressure", psep, "a value for which the normalised gas gravity stays > 0")
	}
	return g, nil
}

// ksLogRsFactor returns ln K in Rs = K·p^(1/C4): K = C1 · γg100^C2 · 10^(C3·API/(T + 459.67)).
// Working with ln K saves an exponential and a logarithm on the hot path.
func ksLogRsFactor(o Oil, cf []float64) (lnK float64, c4 float64, err error) {
	g, err := ksGasGravity(o)
	if err != nil {
		return 0, 0, err
	}
	c := ksLight
	c.c4, c.c1 = cf[1], cf[3]
	if o.API <= 30 {
		c = ksHeavy
		c.c4, c.c1 = cf[0], cf[2]
	}
	return math.Log(c.c1) + c.c2*math.Log(g) + math.Ln10*c.c3*o.API/(o.Temperature+rankine), c.c4, nil
}

// KartoatmodjoSchmidtCoefficients are the constants of the Kartoatmodjo–Schmidt solution-gas
// pair that a refit may change, both sets (the oil's API picks one): Rs = C1·γg100^C2·p^(1/C4)·
// 10^(C3·API/(T + 459.67)).
var KartoatmodjoSchmidtCoefficients = []Coefficient{
	{ID: "c4_heavy", Value: ksHeavy.c4, Role: "C4 = 0.9986, 1/C4 the exponent of p (API ≤ 30)"},
	{ID: "c4_light", Value: ksLight.c4, Role: "C4 = 0.9143, 1/C4 the exponent of p (API > 30)"},
	{ID: "c1_heavy", Value: ksHeavy.c1, Role: "C1 = 0.05958 (API ≤ 30)"},
	{ID: "c1_light", Value: ksLight.c1, Role: "C1 = 0.03150 (API > 30)"},
}

var ksPublished = [4]float64{ksHeavy.c4, ksLight.c4, ksHeavy.c1, ksLight.c1}

// KartoatmodjoSchmidtSolutionGOR returns the solution GOR (scf/STB) at p psia, Kartoatmodjo
// and Schmidt (1994), the published direction:
//
//	Rs = C1 · γg100^C2 · p^(1/C4) · 10^(C3·API/(T + 459.67)),
//
// C1..C4 = 0.05958, 0.7972, 13.1405, 0.9986 for API ≤ 30 and 0.03150, 0.7587, 11.2895,
// 0.9143 above, T °F.
func KartoatmodjoSchmidtSolutionGOR(p float64, o Oil) (float64, error) {
	return KartoatmodjoSchmidtSolutionGORWith(p, o, ksPublished[:])
}

// KartoatmodjoSchmidtSolutionGORWith is KartoatmodjoSchmidtSolutionGOR with the coefficients c
// (KartoatmodjoSchmidtCoefficients order).
func KartoatmodjoSchmidtSolutionGORWith(p float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 4); err != nil {
		return 0, err
	}
	lnK, c4, err := ksLogRsFactor(o, c)
	if err != nil {
		return 0, err
	}
	return finite(math.Exp(lnK + math.Log(p)/c4))
}

// KartoatmodjoSchmidtBubblePoint returns the bubble-point pressure (psia), the closed-form
// inverse published with it: Pb = [Rsb / (C1 · γg100^C2 · 10^(C3·API/(T + 459.67)))]^C4.
func KartoatmodjoSchmidtBubblePoint(rsb float64, o Oil) (float64, error) {
	return KartoatmodjoSchmidtBubblePointWith(rsb, o, ksPublished[:])
}

// KartoatmodjoSchmidtBubblePointWith is KartoatmodjoSchmidtBubblePoint with the coefficients c
// (KartoatmodjoSchmidtCoefficients order).
func KartoatmodjoSchmidtBubblePointWith(rsb float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 4); err != nil {
		return 0, err
	}
	lnK, c4, err := ksLogRsFactor(o, c)
	if err != nil {
		return 0, err
	}
	return finite(math.Exp(c4 * (math.Log(rsb) - lnK)))
}

// KartoatmodjoSchmidtOilFVF returns the saturated oil formation volume factor (rb/STB),
// Kartoatmodjo and Schmidt (1994):
//
//	Bo = 0.98496 + 1e−4·F^1.5,  F = Rs^0.755 · γg100^0.25 · γo^−1.5 + 0.45·T,
//
// T °F. p is not used.
func KartoatmodjoSchmidtOilFVF(p, rs float64, o Oil) (float64, error) {
	return KartoatmodjoSchmidtOilFVFWith(p, rs, o, ksFVFPublished[:])
}

// KartoatmodjoSchmidtFVFCoefficients are the constants of the Kartoatmodjo–Schmidt Bo that a
// refit may change: Bo = a + b·F^n, F = Rs^e·γg100^0.25·γo^−1.5 + t·T.
var KartoatmodjoSchmidtFVFCoefficients = []Coefficient{
	{ID: "n", Value: 1.5, Role: "1.5, the exponent of F"},
	{ID: "t", Value: 0.45, Role: "0.45, the factor of T in F"},
	{ID: "e", Value: 0.755, Role: "0.755, the exponent of Rs in F"},
	{ID: "a", Value: 0.98496, Role: "0.98496"},
	{ID: "b", Value: 1e-4, Role: "1e−4"},
}

var ksFVFPublished = [5]float64{1.5, 0.45, 0.755, 0.98496, 1e-4}

// KartoatmodjoSchmidtOilFVFWith is KartoatmodjoSchmidtOilFVF with the coefficients c
// (KartoatmodjoSchmidtFVFCoefficients order).
func KartoatmodjoSchmidtOilFVFWith(p, rs float64, o Oil, c []float64) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 5); err != nil {
		return 0, err
	}
	g, err := ksGasGravity(o)
	if err != nil {
		return 0, err
	}
	f := math.Exp(c[2]*math.Log(rs)+0.25*math.Log(g)-1.5*math.Log(o.OilGravity())) + c[1]*o.Temperature
	if !(f > 0) {
		return 0, inputError("temperature", o.Temperature, "high enough for a positive Kartoatmodjo–Schmidt correlating number")
	}
	if c[0] == 1.5 {
		return finite(c[3] + c[4]*f*math.Sqrt(f))
	}
	return finite(c[3] + c[4]*pow(f, c[0]))
}

package correlations

import (
	"fmt"
	"math"
)

// Spivey, Valkó and McCain (2007): J.P. Spivey, P.P. Valkó and W.D. McCain, "Applications of the
// Coefficient of Isothermal Compressibility to Various Reservoir Situations With New
// Correlations for Each Situation", SPE Reservoir Evaluation & Engineering 10 (1) (Feb. 2007)
// 43–49, SPE 96415. The undersaturated correlation gives the cumulative (average)
// compressibility c̄o from pb to p, so that Bo(p) = Bob·exp[−c̄o·(p − pb)]:
//
//	ln(c̄o·1e6) = 2.434 + 0.475·Z + 0.048·Z²,  Z = Σ Zn,  Zn = C0n + C1n·Vn + C2n·Vn²,
//
// V = ln API, ln γg, ln pb, ln(p/pb), ln Rsb, ln T (T °F, pressures psia). Data ranges are
// approximate (from memory).

var svmC = [6][3]float64{
	{3.011, -2.6254, 0.497},  // ln API
	{-0.0835, -0.259, 0.382}, // ln γg
	{3.51, -0.0289, -0.0584}, // ln pb
	{0.327, -0.608, 0.0911},  // ln(p/pb)
	{-1.918, -0.642, 0.154},  // ln Rsb
	{2.52, -2.73, 0.429},     // ln T
}

func svmTerm(c *[3]float64, v float64) float64 { return c[0] + v*(c[1]+v*c[2]) }

// svmAverage returns c̄o (1/psi) and dc̄o/dp (1/psi²) at p ≥ pb.
func svmAverage(p, pb, rsb float64, o Oil) (cbar, dcbar float64) {
	l := math.Log(p / pb)
	z := svmTerm(&svmC[0], math.Log(o.API)) + svmTerm(&svmC[1], math.Log(o.separatorGasGravity())) +
		svmTerm(&svmC[2], math.Log(pb)) + svmTerm(&svmC[3], l) +
		svmTerm(&svmC[4], math.Log(rsb)) + svmTerm(&svmC[5], math.Log(o.Temperature))
	cbar = 1e-6 * math.Exp(2.434+0.475*z+0.048*z*z)
	dzdp := (svmC[3][1] + 2*svmC[3][2]*l) / p
	return cbar, cbar * (0.475 + 0.096*z) * dzdp
}

func checkSVM(p, pb, rsb float64, o Oil) error {
	if err := checkOilPositiveT(o); err != nil {
		return err
	}
	if err := checkUndersaturated(p, pb, rsb); err != nil {
		return err
	}
	if rsb == 0 {
		return inputError("Rsb", rsb, "> 0 for the Spivey–Valkó–McCain logarithmic form")
	}
	return nil
}

// SpiveyAverageCo returns the cumulative (average) undersaturated compressibility c̄o (1/psi)
// from pb to p ≥ pb, Spivey, Valkó and McCain (2007), the published quantity.
func SpiveyAverageCo(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkSVM(p, pb, rsb, o); err != nil {
		return 0, err
	}
	c, _ := svmAverage(p, pb, rsb, o)
	return finite(c)
}

// SpiveyCo returns the instantaneous compressibility (1/psi) at p ≥ pb derived from the
// cumulative correlation: co = −d ln Bo/dp = c̄o + (p − pb)·dc̄o/dp.
func SpiveyCo(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkSVM(p, pb, rsb, o); err != nil {
		return 0, err
	}
	c, dc := svmAverage(p, pb, rsb, o)
	return finite(c + (p-pb)*dc)
}

// SpiveyRelativeVolume returns Bo(p)/Bo(pb) = exp[−c̄o·(p − pb)] for p ≥ pb.
func SpiveyRelativeVolume(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkSVM(p, pb, rsb, o); err != nil {
		return 0, err
	}
	c, _ := svmAverage(p, pb, rsb, o)
	return finite(math.Exp(-c * (p - pb)))
}

// McCain, Rollins and Villena (1988): W.D. McCain Jr., J.B. Rollins and A.J. Villena Lanzi,
// "The Coefficient of Isothermal Compressibility of Black Oils at Pressures Below the
// Bubblepoint", SPE Formation Evaluation 3 (Sept. 1988) 659–662, SPE 15664. Data: p 500–5,300
// psia, Pb 763–5,300 psia, T 78–330 °F, 18–52 °API, γg 0.58–1.20, Rsb 15–1,947 scf/STB
// (from memory).

// McCainRollinsVillenaCo returns the oil compressibility (1/psi) below the bubble point
// (p ≤ pb), including the gas coming out of solution, McCain, Rollins and Villena (1988):
//
//	ln co = −7.573 − 1.450·ln p − 0.383·ln pb + 1.402·ln T + 0.256·ln API + 0.449·ln Rsb,
//
// T °R, pressures psia. p above pb is refused.
func McCainRollinsVillenaCo(p, pb, rsb float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkPressure("Pb", pb); err != nil {
		return 0, err
	}
	if err := checkGOR("Rsb", rsb); err != nil {
		return 0, err
	}
	if rsb == 0 {
		return 0, inputError("Rsb", rsb, "> 0 for the McCain–Rollins–Villena logarithmic form")
	}
	if p > pb {
		return 0, inputError("p", p, fmt.Sprintf("≤ Pb = %g psia (McCain–Rollins–Villena is for saturated oil)", pb))
	}
	lnCo := -7.573 - 1.450*math.Log(p) - 0.383*math.Log(pb) + 1.402*math.Log(o.Temperature+rankine) +
		0.256*math.Log(o.API) + 0.449*math.Log(rsb)
	return finite(math.Exp(lnCo))
}

// McCainRollinsVillenaRelativeVolume always returns an ErrInput error: the correlation is for
// p ≤ pb, where the oil volume also changes by the gas leaving solution, so it does not define
// the undersaturated ratio Bo(p)/Bo(pb). It exists so that the family fills every field of
// CompressibilityFamily.
func McCainRollinsVillenaRelativeVolume(p, pb, rsb float64, o Oil) (float64, error) {
	return 0, fmt.Errorf("%w: mccain-rollins-villena gives co below the bubble point (p ≤ Pb); it defines no relative volume above Pb", ErrInput)
}

package correlations

import (
	"fmt"
	"math"
)

// Gas-gravity domain accepted by the pseudo-critical correlations. Outside it the quadratic
// fits stop describing any natural gas (Sutton's ppc even turns negative near γg = 5).
const (
	minGasGravity = 0.3
	maxGasGravity = 3.0
)

func checkGasGravity(g float64) error {
	if !(g >= minGasGravity && g <= maxGasGravity) { // also catches NaN
		return inputError("gas gravity", g, fmt.Sprintf("%g ≤ γg ≤ %g", minGasGravity, maxGasGravity))
	}
	return nil
}

// SuttonCritical returns the pseudo-critical pressure (psia) and temperature (°R) of a
// hydrocarbon gas from its gravity γg (air = 1), after Sutton, R.P. (1985), "Compressibility
// Factors for High-Molecular-Weight Reservoir Gases", SPE 14265:
//
//	ppc = 756.8 − 131.07·γg − 3.6·γg²
//	Tpc = 169.2 + 349.5·γg − 74.0·γg²
//
// Fitted to 264 gas samples with 0.57 < γg < 1.68. For gases with H2S or CO2 apply
// WichertAziz to the result.
func SuttonCritical(gasGravity float64) (ppc, tpc float64, err error) {
	if err := checkGasGravity(gasGravity); err != nil {
		return 0, 0, err
	}
	g := gasGravity
	ppc = 756.8 - 131.07*g - 3.6*g*g
	tpc = 169.2 + 349.5*g - 74.0*g*g
	return ppc, tpc, nil
}

// StandingCritical returns the pseudo-critical pressure (psia) and temperature (°R) from
// the gas gravity γg with Standing's fit for natural-gas (dry-gas) systems, Standing, M.B.
// (1977), Volumetric and Phase Behavior of Oil Field Hydrocarbon Systems, SPE, pp. 125–126:
//
//	ppc = 677 + 15.0·γg − 37.5·γg²
//	Tpc = 168 + 325·γg − 12.5·γg²
//
// Standing also gave a second curve for gas-condensate (wet) gases; it is not used here.
// The curves smooth the low-molecular-weight California natural gases of Brown et al.
func StandingCritical(gasGravity float64) (ppc, tpc float64, err error) {
	if err := checkGasGravity(gasGravity); err != nil {
		return 0, 0, err
	}
	g := gasGravity
	ppc = 677 + 15.0*g - 37.5*g*g
	tpc = 168 + 325*g - 12.5*g*g
	return ppc, tpc, nil
}

// WichertAziz corrects sweet-gas pseudo-criticals ppc (psia) and tpc (°R) for H2S and CO2,
// after Wichert, E. and Aziz, K. (1972), "Calculate Z's for Sour Gases", Hydrocarbon
// Processing 51 (5): 119–122. With A = yH2S + yCO2 and B = yH2S (mole fractions):
//
//	ε    = 120·(A^0.9 − A^1.6) + 15·(B^0.5 − B^4)        (°R)
//	T'pc = Tpc − ε
//	p'pc = ppc·T'pc / (Tpc + B·(1 − B)·ε)
//
// Average absolute error 0.97 % over 154–7,026 psia and 40–300 °F, for CO2 < 54.4 % and
// H2S < 73.8 % (mole).
func WichertAziz(ppc, tpc, yH2S, yCO2 float64) (ppcAdj, tpcAdj float64, err error) {
	switch {
	case !(ppc > 0) || math.IsInf(ppc, 0):
		return 0, 0, inputError("ppc", ppc, "a positive pressure in psia")
	case !(tpc > 0) || math.IsInf(tpc, 0):
		return 0, 0, inputError("tpc", tpc, "a positive temperature in °R")
	case !(yH2S >= 0 && yH2S <= 1):
		return 0, 0, inputError("H2S mole fraction", yH2S, "0 ≤ y ≤ 1 (a fraction, not a percentage)")
	case !(yCO2 >= 0 && yCO2 <= 1):
		return 0, 0, inputError("CO2 mole fraction", yCO2, "0 ≤ y ≤ 1 (a fraction, not a percentage)")
	case yH2S+yCO2 > 1:
		return 0, 0, inputError("H2S + CO2 mole fraction", yH2S+yCO2, "at most 1")
	}
	a := yH2S + yCO2
	b := yH2S
	if a == 0 {
		return ppc, tpc, nil
	}
	eps := 120*(math.Pow(a, 0.9)-math.Pow(a, 1.6)) + 15*(math.Sqrt(b)-b*b*b*b)
	tpcAdj = tpc - eps
	if !(tpcAdj > 0) {
		return 0, 0, inputError("tpc", tpc, fmt.Sprintf("above the sour correction ε = %.4g °R", eps))
	}
	ppcAdj = ppc * tpcAdj / (tpc + b*(1-b)*eps)
	if ppcAdj, err = finite(ppcAdj); err != nil {
		return 0, 0, err
	}
	return ppcAdj, tpcAdj, nil
}

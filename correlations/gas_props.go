package correlations

import (
	"fmt"
	"math"
)

// Constants of the gas-property equations (field units).
const (
	// StdPressure and StdTemperature are the default standard conditions, 14.696 psia and
	// 60 °F (common practice; some labs and jurisdictions use 14.65 psia, see GasFVFStd).
	StdPressure    = 14.696
	StdTemperature = 60.0
	// RankineOffset converts °F to °R.
	RankineOffset = 459.67
	// AirMolarMass is the molar mass of air, lbm/lb-mol (Penn State PNG 520 course notes).
	AirMolarMass = 28.96
	// GasConstant is R in psia·ft³/(lb-mol·°R) (Lyons, ed., Standard Handbook of Petroleum &
	// Natural Gas Engineering, Vol. 2).
	GasConstant = 10.73
	// cubicFeetPerBarrel: 1 bbl = 42 US gal = 5.614583 ft³ (exact by definition).
	cubicFeetPerBarrel = 5.614583
	// lbmPerFt3PerGramPerCC converts lbm/ft³ to g/cm³ (1 g/cm³ = 62.428 lbm/ft³).
	lbmPerFt3PerGramPerCC = 62.428
	// Sane upper limits that catch unit slips (kPa for psia, K for °F) rather than physics.
	maxPressure    = 1e5   // psia
	maxTemperature = 1500. // °F
)

func checkPressure(name string, p float64) error {
	if !(p > 0 && p <= maxPressure) {
		return inputError(name, p, fmt.Sprintf("0 < p ≤ %g psia", float64(maxPressure)))
	}
	return nil
}

func checkTemperatureF(name string, tF float64) error {
	if !(tF > -RankineOffset && tF <= maxTemperature) {
		return inputError(name, tF, fmt.Sprintf("−459.67 < T ≤ %g °F", float64(maxTemperature)))
	}
	return nil
}

func checkZ(z float64) error {
	if !(z > 0 && z <= 10) {
		return inputError("Z", z, "0 < Z ≤ 10")
	}
	return nil
}

// GasFVF returns the gas formation volume factor Bg in rcf/scf at pressure p (psia) and
// temperature tF (°F) for compressibility factor z, at standard conditions of 14.696 psia
// and 60 °F with Z = 1 there:
//
//	Bg = (psc/Tsc)·Z·T/p = 0.02828·Z·(T + 459.67)/p
//
// (often printed as 0.02827, the same ratio rounded; common practice). Use GasFVFStd for
// other standard conditions.
func GasFVF(z, p, tF float64) (float64, error) {
	return GasFVFStd(z, p, tF, StdPressure, StdTemperature)
}

// GasFVFStd is GasFVF with explicit standard pressure psc (psia) and temperature tscF (°F),
// for labs that report at, for example, 14.65 psia:
//
//	Bg = psc·Z·(T + 459.67) / (p·(Tsc + 459.67))   rcf/scf
//
// Z at standard conditions is taken as 1 (common practice).
func GasFVFStd(z, p, tF, psc, tscF float64) (float64, error) {
	if err := checkZ(z); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkTemperatureF("temperature", tF); err != nil {
		return 0, err
	}
	if !(psc >= 10 && psc <= 20) {
		return 0, inputError("standard pressure", psc, "10 ≤ psc ≤ 20 psia")
	}
	if !(tscF >= 0 && tscF <= 100) {
		return 0, inputError("standard temperature", tscF, "0 ≤ Tsc ≤ 100 °F")
	}
	return finite(psc * z * (tF + RankineOffset) / (p * (tscF + RankineOffset)))
}

// GasFVFBarrels returns Bg in rb/Mscf (reservoir barrels per thousand standard cubic feet)
// at 14.696 psia and 60 °F: Bg[rb/Mscf] = 1000·Bg[rcf/scf]/5.614583.
func GasFVFBarrels(z, p, tF float64) (float64, error) {
	bg, err := GasFVF(z, p, tF)
	if err != nil {
		return 0, err
	}
	return bg * 1000 / cubicFeetPerBarrel, nil
}

// GasExpansion returns the gas expansion factor E = 1/Bg in scf/rcf at 14.696 psia and
// 60 °F: the standard volume that one reservoir cubic foot of gas becomes at the surface.
func GasExpansion(z, p, tF float64) (float64, error) {
	bg, err := GasFVF(z, p, tF)
	if err != nil {
		return 0, err
	}
	return finite(1 / bg)
}

// GasDensity returns the gas density in lbm/ft³ from the real-gas law,
//
//	ρg = p·M / (Z·R·T),  M = 28.96·γg,  R = 10.73 psia·ft³/(lb-mol·°R)
//
// (Penn State PNG 520 course notes for M; Lyons, ed., for R), with p in psia and T in °R.
func GasDensity(p, tF, z, gasGravity float64) (float64, error) {
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkTemperatureF("temperature", tF); err != nil {
		return 0, err
	}
	if err := checkZ(z); err != nil {
		return 0, err
	}
	if err := checkGasGravity(gasGravity); err != nil {
		return 0, err
	}
	return finite(p * AirMolarMass * gasGravity / (z * GasConstant * (tF + RankineOffset)))
}

// LeeGonzalezEakin returns the natural-gas viscosity in cP at temperature tF (°F), pressure
// p (psia), compressibility factor z and gas gravity γg, after Lee, A.L., Gonzalez, M.H. and
// Eakin, B.E. (1966), "The Viscosity of Natural Gases", J. Petrol. Technol. 18 (8): 997–1000
// (SPE 1340):
//
//	μg = 1e-4·K·exp(X·ρ^Y)
//	K  = (9.4 + 0.02·M)·T^1.5 / (209 + 19·M + T)
//	X  = 3.5 + 986/T + 0.01·M
//	Y  = 2.4 − 0.2·X
//
// with T in °R, M = 28.96·γg and ρ the gas density in g/cm³ (GasDensity/62.428). Their
// data: four natural gases at 100–340 °F and 100–8,000 psia (from memory).
func LeeGonzalezEakin(tF, p, z, gasGravity float64) (float64, error) {
	rho, err := GasDensity(p, tF, z, gasGravity)
	if err != nil {
		return 0, err
	}
	rho /= lbmPerFt3PerGramPerCC
	t := tF + RankineOffset
	m := AirMolarMass * gasGravity
	k := (9.4 + 0.02*m) * t * math.Sqrt(t) / (209 + 19*m + t)
	x := 3.5 + 986/t + 0.01*m
	y := 2.4 - 0.2*x
	return finite(1e-4 * k * math.Exp(x*math.Exp(y*math.Log(rho))))
}

// GasZFromGravity is a convenience chain: pseudo-criticals of family ppcID from the gas gravity, the
// Wichert–Aziz correction when yH2S or yCO2 (mole fractions) is not zero, then Z of family
// zID at pressure p (psia) and temperature tF (°F). It returns Z and the pseudo-reduced
// temperature and pressure used.
func GasZFromGravity(p, tF, gasGravity, yH2S, yCO2 float64, ppcID, zID string) (z, tpr, ppr float64, err error) {
	pcf, err := PseudoCriticalByID(ppcID)
	if err != nil {
		return 0, 0, 0, err
	}
	zf, err := ZByID(zID)
	if err != nil {
		return 0, 0, 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, 0, 0, err
	}
	if err := checkTemperatureF("temperature", tF); err != nil {
		return 0, 0, 0, err
	}
	ppc, tpc, err := pcf.Critical(gasGravity)
	if err != nil {
		return 0, 0, 0, err
	}
	if ppc, tpc, err = WichertAziz(ppc, tpc, yH2S, yCO2); err != nil {
		return 0, 0, 0, err
	}
	tpr, ppr = (tF+RankineOffset)/tpc, p/ppc
	z, err = zf.Z(tpr, ppr)
	return z, tpr, ppr, err
}

// Rich-gas warning threshold, from the AGA8 comparison in gas_z_test.go
// (testdata/aga8): with Sutton pseudo-criticals and gravity alone, the 0.60 and 0.70 gases
// stay within 3.4 % of GERG-2008 at 100–250 °F (Tpr ≥ 1.48), while the 0.80 and 0.90 gases
// are off by 3–18 % wherever Tpr < 1.8 (worst near Tpr 1.3–1.4 and Ppr 1.5–5).
const (
	richGasGravity = 0.75
	richGasTpr     = 1.8
)

// RichGasWarning returns a non-empty warning when a gravity-only Z (Sutton pseudo-criticals,
// then DAK or Hall–Yarborough) is unreliable: a rich gas (γg ≥ 0.75) at low pseudo-reduced
// temperature (Tpr < 1.8, Tpr from Sutton's Tpc). Otherwise it returns "".
func RichGasWarning(gasGravity, tpr float64) string {
	if gasGravity >= richGasGravity && tpr < richGasTpr {
		return fmt.Sprintf("gas gravity %.3g at Tpr %.3g: a Z from gas gravity alone can be off by 5–18 %% "+
			"for a rich gas at low reduced temperature; use the gas composition or a measured Z", gasGravity, tpr)
	}
	return ""
}

package correlations

import "math"

// Input checks shared by the oil correlations. They return nil on the hot path and build a
// formatted error only when an input is unusable.

// rankine is the offset from °F to °R (RankineOffset, 459.67), used everywhere a paper works in
// absolute temperature, also where the paper itself writes T + 460 (Vasquez–Beggs,
// Kartoatmodjo–Schmidt): one constant throughout, a difference of 0.07 % in T.
const rankine = RankineOffset

// Default first-stage separator conditions, used when Oil leaves them at zero: 100 psig
// (114.7 psia), the reference pressure of Vasquez and Beggs (1980), and 60 °F.
const (
	defaultSepPressure    = 114.7 // psia
	defaultSepTemperature = 60.0  // °F
)

func isFinite(v float64) bool { return !math.IsNaN(v) && !math.IsInf(v, 0) }

// checkOil validates the fluid description common to every oil correlation.
func checkOil(o Oil) error {
	switch {
	case !(o.API > 0) || math.IsInf(o.API, 0):
		return inputError("API", o.API, "a finite value > 0")
	case !(o.GasGravity > 0) || math.IsInf(o.GasGravity, 0):
		return inputError("gas gravity", o.GasGravity, "a finite value > 0")
	case !(o.Temperature > -rankine) || math.IsInf(o.Temperature, 0):
		return inputError("temperature", o.Temperature, "a finite value above -459.67 °F")
	case !(o.SepPressure >= 0) || math.IsInf(o.SepPressure, 0):
		return inputError("separator pressure", o.SepPressure, "0 (unknown) or a finite value > 0")
	case !(o.SepTemperature > -rankine) || math.IsInf(o.SepTemperature, 0):
		return inputError("separator temperature", o.SepTemperature, "0 (unknown) or a finite value above -459.67 °F")
	}
	return nil
}

// checkOilPositiveT is checkOil for correlations that raise the Fahrenheit temperature to a
// power or take its logarithm, which needs T > 0 °F.
func checkOilPositiveT(o Oil) error {
	if err := checkOil(o); err != nil {
		return err
	}
	if !(o.Temperature > 0) {
		return inputError("temperature", o.Temperature, "> 0 °F for this correlation")
	}
	return nil
}

func checkGOR(name string, rs float64) error {
	if !(rs >= 0) || math.IsInf(rs, 0) {
		return inputError(name, rs, "a finite value ≥ 0 scf/STB")
	}
	return nil
}

// sepConditions returns the first-stage separator pressure (psia) and temperature (°F), with
// the defaults for unknown (zero) values.
func sepConditions(o Oil) (psep, tsep float64) {
	psep, tsep = o.SepPressure, o.SepTemperature
	if psep == 0 {
		psep = defaultSepPressure
	}
	if tsep == 0 {
		tsep = defaultSepTemperature
	}
	return psep, tsep
}

// pow returns x^y for x ≥ 0 as exp(y·ln x): faster than math.Pow, which spends most of its
// time on special cases the correlations never meet, and accurate to a few ulps for the
// exponents used here. pow(0, y) is 0 for y > 0 and +Inf for y < 0, as for math.Pow.
func pow(x, y float64) float64 { return math.Exp(y * math.Log(x)) }

// pow10 returns 10^x.
func pow10(x float64) float64 { return math.Exp(x * math.Ln10) }

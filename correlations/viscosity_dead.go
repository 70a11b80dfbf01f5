package correlations

import (
	"fmt"
	"math"
)

// checkDeadOil validates the inputs of the dead-oil viscosity correlations. The equations
// raise °F temperatures to powers and take log10(API), so both must be positive; the upper
// limits catch unit slips (°C or K for °F, specific gravity for API).
func checkDeadOil(o Oil) error {
	if !(o.API > 1 && o.API <= 100) {
		return inputError("API", o.API, "1 < API ≤ 100 °API")
	}
	if !(o.Temperature > 0 && o.Temperature <= 600) {
		return inputError("temperature", o.Temperature, "0 < T ≤ 600 °F")
	}
	return nil
}

// positive returns v when it is a finite positive viscosity and an error otherwise: a
// correlation evaluated far outside its data can give zero or negative values.
func positive(id string, v float64) (float64, error) {
	v, err := finite(v)
	if err != nil {
		return 0, err
	}
	if !(v > 0) {
		return 0, fmt.Errorf("%w: %s gives a non-positive viscosity (%g cP) for these inputs", ErrInput, id, v)
	}
	return v, nil
}

// BealDeadViscosity returns the dead-oil viscosity in cP at o.Temperature (°F) from the
// stock-tank gravity o.API, after Beal, C. (1946), "The Viscosity of Air, Water, Natural Gas,
// Crude Oil and Its Associated Gases at Oil Field Temperatures and Pressures", Trans. AIME
// 165: 94–115, in the equation that Standing (Volumetric and Phase Behavior of Oil Field
// Hydrocarbon Systems, SPE, 1977/1981) fitted to Beal's chart:
//
//	μod = (0.32 + 1.8e7/API^4.53)·(360/(T + 200))^a,  a = 10^(0.43 + 8.33/API)
//
// Beal's gas-free crudes: 10.1–52.5 °API, about 98–250 °F. For oils below 14 °API above
// about 220 °F the fit is not monotonic in API (a heavier oil comes out less viscous).
func BealDeadViscosity(o Oil) (float64, error) {
	return BealDeadViscosityWith(o, bealPublished[:])
}

// BealDeadCoefficients are the constants of Beal's dead-oil viscosity that a refit may change:
// μod = (base + scale/API^power)·(360/(T + 200))^a, a = 10^(intercept + slope/API).
var BealDeadCoefficients = []Coefficient{
	{ID: "power", Value: 4.53, Role: "4.53, the exponent of API"},
	{ID: "slope", Value: 8.33, Role: "8.33, the factor of 1/API in the temperature exponent"},
	{ID: "intercept", Value: 0.43, Role: "0.43 in the temperature exponent 10^(0.43 + 8.33/API)"},
	{ID: "base", Value: 0.32, Role: "0.32, the viscosity of the lightest oils at 160 °F"},
	{ID: "scale", Value: 1.8e7, Role: "1.8e7, the factor of API^−4.53"},
}

var bealPublished = [5]float64{4.53, 8.33, 0.43, 0.32, 1.8e7}

// BealDeadViscosityWith is BealDeadViscosity with the coefficients c (BealDeadCoefficients
// order).
func BealDeadViscosityWith(o Oil, c []float64) (float64, error) {
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 5); err != nil {
		return 0, err
	}
	a := pow10(c[2] + c[1]/o.API)
	mu := (c[3] + c[4]/math.Pow(o.API, c[0])) * math.Pow(360/(o.Temperature+200), a)
	return positive("beal", mu)
}

// BeggsRobinsonDeadViscosity returns the dead-oil viscosity in cP at o.Temperature (°F),
// after Beggs, H.D. and Robinson, J.R. (1975), "Estimating the Viscosity of Crude Oil
// Systems", J. Petrol. Technol. 27 (9): 1140–1141 (SPE 5434):
//
//	μod = 10^X − 1,  X = 10^(3.0324 − 0.02023·API)·T^−1.163
//
// 460 dead-oil observations, 16–58 °API, 70–295 °F.
func BeggsRobinsonDeadViscosity(o Oil) (float64, error) {
	return BeggsRobinsonDeadViscosityWith(o, beggsRobinsonDeadPublished[:])
}

// BeggsRobinsonDeadCoefficients are the constants of the Beggs–Robinson dead-oil viscosity
// that a refit may change: μod = 10^X − 1, X = 10^(constant − slope·API)·T^−exponent.
var BeggsRobinsonDeadCoefficients = []Coefficient{
	{ID: "exponent", Value: 1.163, Role: "1.163, the exponent of T"},
	{ID: "slope", Value: 0.02023, Role: "0.02023, the factor of API"},
	{ID: "constant", Value: 3.0324, Role: "3.0324, the constant of log X"},
}

var beggsRobinsonDeadPublished = [3]float64{1.163, 0.02023, 3.0324}

// BeggsRobinsonDeadViscosityWith is BeggsRobinsonDeadViscosity with the coefficients c
// (BeggsRobinsonDeadCoefficients order).
func BeggsRobinsonDeadViscosityWith(o Oil, c []float64) (float64, error) {
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 3); err != nil {
		return 0, err
	}
	x := pow10(c[2]-c[1]*o.API) * math.Pow(o.Temperature, -c[0])
	return positive("beggs-robinson", pow10(x)-1)
}

// GlasoDeadViscosity returns the dead-oil viscosity in cP at o.Temperature (°F), after
// Glasø, Ø. (1980), "Generalized Pressure-Volume-Temperature Correlations", J. Petrol.
// Technol. 32 (5): 785–795 (SPE 8016):
//
//	μod = 3.141e10·T^−3.444·(log10 API)^a,  a = 10.313·log10(T) − 36.447
//
// North Sea oils, 20.1–48.1 °API, 50–300 °F.
func GlasoDeadViscosity(o Oil) (float64, error) {
	return GlasoDeadViscosityWith(o, glasoDeadPublished[:])
}

// GlasoDeadCoefficients are the constants of Glasø's dead-oil viscosity that a refit may
// change: μod = scale·T^−power·(log10 API)^(slope·log10 T − offset). The Kartoatmodjo–Schmidt
// and Petrosky–Farshad dead-oil correlations have the same form and the same coefficient ids.
var GlasoDeadCoefficients = []Coefficient{
	{ID: "power", Value: 3.444, Role: "3.444, the exponent of T"},
	{ID: "slope", Value: 10.313, Role: "10.313, the factor of log T in the exponent of log API"},
	{ID: "offset", Value: 36.447, Role: "36.447, subtracted in the exponent of log API"},
	{ID: "scale", Value: 3.141e10, Role: "3.141e10, the leading factor"},
}

var glasoDeadPublished = [4]float64{3.444, 10.313, 36.447, 3.141e10}

// GlasoDeadViscosityWith is GlasoDeadViscosity with the coefficients c (GlasoDeadCoefficients
// order).
func GlasoDeadViscosityWith(o Oil, c []float64) (float64, error) {
	return logAPIDead("glaso", o, c)
}

// logAPIDead evaluates the form shared by Glasø, Kartoatmodjo–Schmidt and Petrosky–Farshad,
// μod = c[3]·T^−c[0]·(log10 API)^(c[1]·log10 T − c[2]).
func logAPIDead(id string, o Oil, c []float64) (float64, error) {
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 4); err != nil {
		return 0, err
	}
	a := c[1]*math.Log10(o.Temperature) - c[2]
	mu := c[3] * math.Pow(o.Temperature, -c[0]) * math.Pow(math.Log10(o.API), a)
	return positive(id, mu)
}

// EgbogahNgDeadViscosity returns the dead-oil viscosity in cP at o.Temperature (°F), after
// Egbogah, E.O. and Ng, J.T. (1990), "An Improved Temperature-Viscosity Correlation for
// Crude Oil Systems", J. Petrol. Sci. Eng. 4 (3): 197–200:
//
//	log10(log10(μod + 1)) = 1.8653 − 0.025086·API − 0.5644·log10(T)
//
// 394 oil systems, 5–58 °API, 59–176 °F.
func EgbogahNgDeadViscosity(o Oil) (float64, error) {
	return EgbogahNgDeadViscosityWith(o, egbogahNgPublished[:])
}

// EgbogahNgCoefficients are the constants of the Egbogah–Ng dead-oil viscosity that a refit
// may change: log log(μod + 1) = constant − slope·API − exponent·log T.
var EgbogahNgCoefficients = []Coefficient{
	{ID: "exponent", Value: 0.5644, Role: "0.5644, the factor of log T"},
	{ID: "slope", Value: 0.025086, Role: "0.025086, the factor of API"},
	{ID: "constant", Value: 1.8653, Role: "1.8653, the constant"},
}

var egbogahNgPublished = [3]float64{0.5644, 0.025086, 1.8653}

// EgbogahNgDeadViscosityWith is EgbogahNgDeadViscosity with the coefficients c
// (EgbogahNgCoefficients order).
func EgbogahNgDeadViscosityWith(o Oil, c []float64) (float64, error) {
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	if err := checkCoefficients(c, 3); err != nil {
		return 0, err
	}
	x := pow10(c[2] - c[1]*o.API - c[0]*math.Log10(o.Temperature))
	return positive("egbogah-ng", pow10(x)-1)
}

// KartoatmodjoSchmidtDeadViscosity returns the dead-oil viscosity in cP at o.Temperature
// (°F), after Kartoatmodjo, T. and Schmidt, Z. (1994), "Large Data Bank Improves Crude
// Physical Property Correlations", Oil and Gas Journal 92 (27): 51–55:
//
//	μod = 16e8·T^−2.8177·(log10 API)^(5.7526·log10(T) − 26.9718)
//
// 661 crude samples (mostly Indonesian), 14.4–59 °API, 80–320 °F.
func KartoatmodjoSchmidtDeadViscosity(o Oil) (float64, error) {
	return KartoatmodjoSchmidtDeadViscosityWith(o, ksDeadPublished[:])
}

// KartoatmodjoSchmidtDeadCoefficients are the constants of the Kartoatmodjo–Schmidt dead-oil
// viscosity that a refit may change, in the form and order of GlasoDeadCoefficients.
var KartoatmodjoSchmidtDeadCoefficients = []Coefficient{
	{ID: "power", Value: 2.8177, Role: "2.8177, the exponent of T"},
	{ID: "slope", Value: 5.7526, Role: "5.7526, the factor of log T in the exponent of log API"},
	{ID: "offset", Value: 26.9718, Role: "26.9718, subtracted in the exponent of log API"},
	{ID: "scale", Value: 16e8, Role: "16e8, the leading factor"},
}

var ksDeadPublished = [4]float64{2.8177, 5.7526, 26.9718, 16e8}

// KartoatmodjoSchmidtDeadViscosityWith is KartoatmodjoSchmidtDeadViscosity with the
// coefficients c (KartoatmodjoSchmidtDeadCoefficients order).
func KartoatmodjoSchmidtDeadViscosityWith(o Oil, c []float64) (float64, error) {
	return logAPIDead("kartoatmodjo-schmidt", o, c)
}

// PetroskyFarshadDeadViscosity returns the dead-oil viscosity in cP at o.Temperature (°F),
// after Petrosky, G.E. Jr. and Farshad, F.F. (1995), "Viscosity Correlations for Gulf of
// Mexico Crude Oils", SPE 29468:
//
//	μod = 2.3511e7·T^−2.10255·(log10 API)^X,  X = 4.59388·log10(T) − 22.82792
//
// Gulf of Mexico oils, 25.4–46.1 °API, 114–288 °F.
func PetroskyFarshadDeadViscosity(o Oil) (float64, error) {
	return PetroskyFarshadDeadViscosityWith(o, pfDeadPublished[:])
}

// PetroskyFarshadDeadCoefficients are the constants of the Petrosky–Farshad dead-oil viscosity
// that a refit may change, in the form and order of GlasoDeadCoefficients.
var PetroskyFarshadDeadCoefficients = []Coefficient{
	{ID: "power", Value: 2.10255, Role: "2.10255, the exponent of T"},
	{ID: "slope", Value: 4.59388, Role: "4.59388, the factor of log T in the exponent of log API"},
	{ID: "offset", Value: 22.82792, Role: "22.82792, subtracted in the exponent of log API"},
	{ID: "scale", Value: 2.3511e7, Role: "2.3511e7, the leading factor"},
}

var pfDeadPublished = [4]float64{2.10255, 4.59388, 22.82792, 2.3511e7}

// PetroskyFarshadDeadViscosityWith is PetroskyFarshadDeadViscosity with the coefficients c
// (PetroskyFarshadDeadCoefficients order).
func PetroskyFarshadDeadViscosityWith(o Oil, c []float64) (float64, error) {
	return logAPIDead("petrosky-farshad", o, c)
}

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
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	a := pow10(0.43 + 8.33/o.API)
	mu := (0.32 + 1.8e7/math.Pow(o.API, 4.53)) * math.Pow(360/(o.Temperature+200), a)
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
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	x := pow10(3.0324-0.02023*o.API) * math.Pow(o.Temperature, -1.163)
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
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	a := 10.313*math.Log10(o.Temperature) - 36.447
	mu := 3.141e10 * math.Pow(o.Temperature, -3.444) * math.Pow(math.Log10(o.API), a)
	return positive("glaso", mu)
}

// EgbogahNgDeadViscosity returns the dead-oil viscosity in cP at o.Temperature (°F), after
// Egbogah, E.O. and Ng, J.T. (1990), "An Improved Temperature-Viscosity Correlation for
// Crude Oil Systems", J. Petrol. Sci. Eng. 4 (3): 197–200:
//
//	log10(log10(μod + 1)) = 1.8653 − 0.025086·API − 0.5644·log10(T)
//
// 394 oil systems, 5–58 °API, 59–176 °F.
func EgbogahNgDeadViscosity(o Oil) (float64, error) {
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	x := pow10(1.8653 - 0.025086*o.API - 0.5644*math.Log10(o.Temperature))
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
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	a := 5.7526*math.Log10(o.Temperature) - 26.9718
	mu := 16e8 * math.Pow(o.Temperature, -2.8177) * math.Pow(math.Log10(o.API), a)
	return positive("kartoatmodjo-schmidt", mu)
}

// PetroskyFarshadDeadViscosity returns the dead-oil viscosity in cP at o.Temperature (°F),
// after Petrosky, G.E. Jr. and Farshad, F.F. (1995), "Viscosity Correlations for Gulf of
// Mexico Crude Oils", SPE 29468:
//
//	μod = 2.3511e7·T^−2.10255·(log10 API)^X,  X = 4.59388·log10(T) − 22.82792
//
// Gulf of Mexico oils, 25.4–46.1 °API, 114–288 °F.
func PetroskyFarshadDeadViscosity(o Oil) (float64, error) {
	if err := checkDeadOil(o); err != nil {
		return 0, err
	}
	x := 4.59388*math.Log10(o.Temperature) - 22.82792
	mu := 2.3511e7 * math.Pow(o.Temperature, -2.10255) * math.Pow(math.Log10(o.API), x)
	return positive("petrosky-farshad", mu)
}

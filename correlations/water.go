package correlations

import "math"

// Formation water (brine) at reservoir conditions, for the water table of a simulation deck.
// Salinity is the weight percent of dissolved solids (NaCl equivalent); 10,000 ppm (mg/kg)
// is 1 wt %.
//
// McCain (1990): W.D. McCain Jr., The Properties of Petroleum Fluids, 2nd ed., PennWell,
// Tulsa (1990), ch. 16; the same equations with their ranges in W.D. McCain Jr.,
// "Reservoir-Fluid Property Correlations — State of the Art", SPE Reservoir Engineering 6 (2)
// (May 1991) 266–272, SPE 18571.
// Osif (1988): T.L. Osif, "The Effects of Salt, Gas, Temperature, and Pressure on the
// Compressibility of Water", SPE Reservoir Engineering 3 (1) (Feb. 1988) 175–181, SPE 13174.

const (
	refMcCainWater = "W.D. McCain Jr., The Properties of Petroleum Fluids, 2nd ed., PennWell (1990), ch. 16; W.D. McCain Jr., \"Reservoir-Fluid Property Correlations — State of the Art\", SPE Reservoir Engineering 6 (May 1991) 266–272, SPE 18571"
	refOsif        = "T.L. Osif, \"The Effects of Salt, Gas, Temperature, and Pressure on the Compressibility of Water\", SPE Reservoir Engineering 3 (Feb. 1988) 175–181, SPE 13174"

	// maxSalinity is the solubility of NaCl in water near room temperature, about 26.4 wt %
	// (common practice); a brine cannot hold more.
	maxSalinity = 26.4
	// gramPerLitrePerLbmFt3: 1 lbm/ft³ = 16.01846 kg/m³ = 16.01846 g/L.
	gramPerLitrePerLbmFt3 = 16.01846337
)

// Water property ids of the catalog.
const (
	WaterFVF             Property = "bw"     // formation-water FVF, rb/STB
	WaterCompressibility Property = "cw"     // formation-water compressibility (above its bubble point), 1/psi
	WaterViscosity       Property = "mu_w"   // formation-water viscosity, cP
	WaterDensity         Property = "rho_ws" // formation-water density at standard conditions, lbm/ft³
)

func checkSalinity(s float64) error {
	if !(s >= 0 && s <= maxSalinity) {
		return inputError("salinity", s, "0 ≤ S ≤ 26.4 wt % (NaCl saturates near 26.4 %)")
	}
	return nil
}

// McCainWaterFVF returns the formation volume factor (rb/STB) of formation water at p psia
// and tF °F, McCain (1990):
//
//	Bw = (1 + ΔVwp)·(1 + ΔVwt),
//	ΔVwt = −1.0001e−2 + 1.33391e−4·T + 5.50654e−7·T²,
//	ΔVwp = −1.95301e−9·p·T − 1.72834e−13·p²·T − 3.58922e−7·p − 2.25341e−10·p²,
//
// for gas-saturated water; McCain notes that salinity changes Bw by much less than the
// correlation's error, so it takes none. Data: T to 260 °F, p to 5,000 psia, the full range
// of salinities (SPE 18571).
func McCainWaterFVF(p, tF float64) (float64, error) {
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkTemperatureF("temperature", tF); err != nil {
		return 0, err
	}
	dvt := -1.0001e-2 + 1.33391e-4*tF + 5.50654e-7*tF*tF
	dvp := -1.95301e-9*p*tF - 1.72834e-13*p*p*tF - 3.58922e-7*p - 2.25341e-10*p*p
	bw := (1 + dvp) * (1 + dvt)
	if !(bw > 0) {
		return 0, inputError("p", p, "a pressure and temperature where McCain's Bw stays positive")
	}
	return finite(bw)
}

// McCainWaterViscosity returns the viscosity (cP) of formation water of salinity s wt % at
// p psia and tF °F, McCain (1990): at atmospheric pressure
//
//	μw1 = A·T^B,
//	A = 109.574 − 8.40564·S + 0.313314·S² + 8.72213e−3·S³,
//	B = −1.12166 + 2.63951e−2·S − 6.79461e−4·S² − 5.47119e−5·S³ + 1.55586e−6·S⁴,
//
// and at pressure μw = μw1·(0.9994 + 4.0295e−5·p + 3.1062e−9·p²). Data (SPE 18571, ranges
// from memory): μw1 for 100–400 °F and S to 26 %; the pressure factor for 86.5–167 °F and
// p to 14,000 psia.
func McCainWaterViscosity(p, tF, s float64) (float64, error) {
	mu1, err := mcCainWaterViscosity1(tF, s)
	if err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	return finite(mu1 * mcCainWaterViscosityFactor(p))
}

// McCainWaterViscosibility returns (1/μw)·dμw/dp (1/psi) of McCain's water viscosity at p psia:
// the pressure factor's logarithmic slope, (4.0295e−5 + 2·3.1062e−9·p)/(0.9994 + 4.0295e−5·p
// + 3.1062e−9·p²). It does not depend on temperature or salinity.
func McCainWaterViscosibility(p float64) (float64, error) {
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	return finite((4.0295e-5 + 2*3.1062e-9*p) / mcCainWaterViscosityFactor(p))
}

func mcCainWaterViscosityFactor(p float64) float64 { return 0.9994 + 4.0295e-5*p + 3.1062e-9*p*p }

func mcCainWaterViscosity1(tF, s float64) (float64, error) {
	if err := checkSalinity(s); err != nil {
		return 0, err
	}
	if !(tF > 0 && tF <= maxTemperature) {
		return 0, inputError("temperature", tF, "0 < T °F (McCain's water viscosity is a power of T in °F)")
	}
	a := 109.574 + s*(-8.40564+s*(0.313314+s*8.72213e-3))
	b := -1.12166 + s*(2.63951e-2+s*(-6.79461e-4+s*(-5.47119e-5+s*1.55586e-6)))
	return finite(a * math.Pow(tF, b))
}

// McCainBrineDensity returns the density (lbm/ft³) of formation water of salinity s wt % at
// standard conditions (14.7 psia, 60 °F), McCain (1990):
//
//	ρw = 62.368 + 0.438603·S + 1.60074e−3·S².
func McCainBrineDensity(s float64) (float64, error) {
	if err := checkSalinity(s); err != nil {
		return 0, err
	}
	return finite(62.368 + s*(0.438603+s*1.60074e-3))
}

// BrineConcentration returns the salt concentration (g/L) of a brine of s wt % at standard
// conditions, S/100·ρw, with McCain's standard-condition density (McCainBrineDensity): the
// salinity measure that Osif's compressibility takes.
func BrineConcentration(s float64) (float64, error) {
	rho, err := McCainBrineDensity(s)
	if err != nil {
		return 0, err
	}
	return finite(s / 100 * rho * gramPerLitrePerLbmFt3)
}

// OsifWaterCompressibility returns the isothermal compressibility (1/psi) of gas-free
// formation water holding c g/L of NaCl at p psia and tF °F, above its bubble point,
// Osif (1988):
//
//	cw = 1 / (7.033·p + 541.5·C − 537.0·T + 403,300).
//
// Data: 1,000–20,000 psia, 200–270 °F, 0–200 g/L (SPE 18571).
func OsifWaterCompressibility(p, tF, c float64) (float64, error) {
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkTemperatureF("temperature", tF); err != nil {
		return 0, err
	}
	if !(c >= 0 && c <= 400) {
		return 0, inputError("salt concentration", c, "0 ≤ C ≤ 400 g/L")
	}
	d := 7.033*p + 541.5*c - 537.0*tF + 403300
	if !(d > 0) {
		return 0, inputError("temperature", tF, "a temperature where Osif's denominator stays positive (far below 750 °F)")
	}
	return finite(1 / d)
}

// waterEntries lists the formation-water correlations. Their inputs are "temperature" (°F),
// "p" (psia), "salinity" (wt %) and "salt concentration" (g/L).
func waterEntries() []Entry {
	return []Entry{
		{
			ID: "mccain", Property: WaterFVF, Authors: "McCain", Year: 1990, Reference: refMcCainWater,
			// SPE 18571: "temperatures to 260 °F and pressures to 5,000 psia"; the lower
			// temperature bound (60 °F, standard conditions) is ours.
			Ranges: []Range{
				{Input: "temperature", Unit: "°F", Min: 60, Max: 260},
				{Input: "p", Unit: "psia", Min: 14.7, Max: 5000},
			},
			Convention: "gas-saturated formation water; salinity neglected (McCain: its effect is below the correlation's error)",
		},
		{
			ID: "osif", Property: WaterCompressibility, Authors: "Osif", Year: 1988, Reference: refOsif,
			Ranges: []Range{
				{Input: "temperature", Unit: "°F", Min: 200, Max: 270},
				{Input: "p", Unit: "psia", Min: 1000, Max: 20000},
				{Input: "salt concentration", Unit: "g/L", Min: 0, Max: 200},
			},
			Convention: "gas-free brine above its bubble point; salinity as g/L of NaCl, from wt % with McCain's standard-condition brine density",
		},
		{
			ID: "mccain", Property: WaterViscosity, Authors: "McCain", Year: 1990, Reference: refMcCainWater,
			// From memory (SPE 18571): atmospheric viscosity 100–400 °F, salinity to 26 %;
			// the pressure factor 86.5–167 °F, to 14,000 psia.
			Ranges: []Range{
				{Input: "temperature", Unit: "°F", Min: 100, Max: 400},
				{Input: "salinity", Unit: "wt %", Min: 0, Max: 26},
				{Input: "p", Unit: "psia", Min: 14.7, Max: 14000},
			},
			Convention: "salinity as weight percent of solids (NaCl equivalent); the pressure factor was fitted at 86.5–167 °F",
		},
		{
			ID: "mccain", Property: WaterDensity, Authors: "McCain", Year: 1990, Reference: refMcCainWater,
			Ranges:     []Range{{Input: "salinity", Unit: "wt %", Min: 0, Max: 26}},
			Convention: "at standard conditions (14.7 psia, 60 °F); salinity as weight percent of solids",
		},
	}
}

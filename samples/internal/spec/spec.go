// Package spec describes how each demo report is generated; it has no embedded data, so that
// the generator can use it before the reports exist.
package spec

// Spec describes how one demo report is made: the fluid, the correlation families the
// generator draws it from, their multipliers and the noise. The values are invented.
type Spec struct {
	ID          string
	Well        string
	Description string
	API         float64 // stock-tank API
	GasGravity  float64 // separator gas gravity (GOR-weighted over the stages)
	Temperature float64 // reservoir temperature, °F
	Rsb         float64 // separator-basis solution GOR at Pb, scf/STB
	Metric      bool    // written in metric units (bara, degC, sm3/sm3…)

	// Families and multipliers the lab "truth" is made from (fit package conventions).
	Pb, Bo, Co, MuDead, MuSat, MuUnder string
	MPb, MBo, MCo, MMuDead, MMuSat     float64
	MMuUnder, MZ                       float64
	Noise                              float64 // relative noise (standard deviation)
	Seed                               uint64

	// PbCoef and BoCoef, when set, replace the published coefficients of the Pb and Bo families
	// (in their catalog declaration order), so that the report's Rs and Bo curves have a shape
	// that no published family has, as real oils do.
	PbCoef, BoCoef []float64
}

// Specs are the three demo reports, in an invented field: the Tamsin Ridge field, operated by
// the invented Harrow Basin Petroleum, wells TR-3, TR-7 and TR-12.
var Specs = []Spec{
	{ID: "tr3-black", Well: "TR-3", Description: "black oil, Tamsin Ridge TR-3 (invented)",
		API: 30.5, GasGravity: 0.82, Temperature: 195, Rsb: 620,
		Pb: "standing", Bo: "standing", Co: "vasquez-beggs", MuDead: "beggs-robinson", MuSat: "beggs-robinson", MuUnder: "vasquez-beggs",
		MPb: 0.73, MBo: 0.96, MCo: 1.10, MMuDead: 1.08, MMuSat: 0.95, MMuUnder: 1.05, MZ: 1.06, Noise: 0.004, Seed: 3,
		// A straighter Rs(p) with more gas left at low pressure than any published family
		// (Standing's offset 1.4 → 2.6 and exponent 1.2048 → 1.12, the pressure scale 0.73
		// bringing Pb near 3,000 psia), and a Bo that bends less (exponent 1.2 → 1.15, its
		// factor raised to keep Bob).
		PbCoef: []float64{18.2, 2.6, 1.12}, BoCoef: []float64{1.15, 1.25, 0.5, 0.9759, 1.69e-4}},
	{ID: "tr7-light", Well: "TR-7", Description: "light, volatile-leaning oil, Tamsin Ridge TR-7 (invented)",
		API: 42, GasGravity: 0.88, Temperature: 240, Rsb: 1400, Metric: true,
		Pb: "glaso", Bo: "glaso", Co: "petrosky-farshad", MuDead: "glaso", MuSat: "chew-connally", MuUnder: "beal",
		MPb: 0.93, MBo: 1.04, MCo: 0.92, MMuDead: 1.10, MMuSat: 1.05, MMuUnder: 0.95, MZ: 0.94, Noise: 0.004, Seed: 7},
	{ID: "tr12-heavy", Well: "TR-12", Description: "heavy oil, Tamsin Ridge TR-12 (invented)",
		API: 18, GasGravity: 0.68, Temperature: 150, Rsb: 150,
		Pb: "vasquez-beggs", Bo: "vasquez-beggs", Co: "spivey-valko-mccain", MuDead: "egbogah-ng", MuSat: "kartoatmodjo-schmidt", MuUnder: "kartoatmodjo-schmidt",
		MPb: 1.12, MBo: 1.05, MCo: 1.08, MMuDead: 0.90, MMuSat: 1.10, MMuUnder: 1.12, MZ: 1.00, Noise: 0.004, Seed: 12},
}

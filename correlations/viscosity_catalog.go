package correlations

// viscosityEntries lists the oil-viscosity correlations. Data ranges come from the papers as
// quoted in secondary sources; those not checked against the original are marked in comments.
func viscosityEntries() []Entry {
	const (
		refBeal = "Beal, C.: The Viscosity of Air, Water, Natural Gas, Crude Oil and Its Associated Gases at Oil Field Temperatures and Pressures, Trans. AIME 165: 94–115 (1946); equation by Standing, M.B.: Volumetric and Phase Behavior of Oil Field Hydrocarbon Systems, SPE (1981)"
		refBR   = "Beggs, H.D. and Robinson, J.R.: Estimating the Viscosity of Crude Oil Systems, J. Petrol. Technol. 27 (9): 1140–1141 (1975), SPE 5434"
		refKS   = "Kartoatmodjo, T. and Schmidt, Z.: Large Data Bank Improves Crude Physical Property Correlations, Oil and Gas Journal 92 (27): 51–55 (1994)"
		refPF   = "Petrosky, G.E. Jr. and Farshad, F.F.: Viscosity Correlations for Gulf of Mexico Crude Oils, SPE 29468 (1995)"
	)
	api := func(lo, hi float64) Range { return Range{Input: "API", Unit: "°API", Min: lo, Max: hi} }
	temp := func(lo, hi float64) Range { return Range{Input: "temperature", Unit: "°F", Min: lo, Max: hi} }
	rs := func(lo, hi float64) Range { return Range{Input: "Rs", Unit: "scf/STB", Min: lo, Max: hi} }
	pr := func(lo, hi float64) Range { return Range{Input: "p", Unit: "psia", Min: lo, Max: hi} }
	mud := func(lo, hi float64) Range { return Range{Input: "mu_dead", Unit: "cP", Min: lo, Max: hi} }
	const stockTank = "stock-tank oil gravity; gas-free oil at reservoir temperature"
	const atPb = "p ≥ Pb; viscosity at the bubble point from a saturated family or the lab"

	return []Entry{
		// Dead oil.
		{ID: "beal", Property: DeadViscosity, Authors: "Beal", Year: 1946, Reference: refBeal,
			Ranges: []Range{api(10.1, 52.5), temp(98, 250)}, Convention: stockTank},
		{ID: "beggs-robinson", Property: DeadViscosity, Authors: "Beggs and Robinson", Year: 1975, Reference: refBR,
			Ranges: []Range{api(16, 58), temp(70, 295)}, Convention: stockTank},
		{ID: "glaso", Property: DeadViscosity, Authors: "Glasø", Year: 1980,
			Reference: "Glasø, Ø.: Generalized Pressure-Volume-Temperature Correlations, J. Petrol. Technol. 32 (5): 785–795 (1980), SPE 8016",
			Ranges:    []Range{api(20.1, 48.1), temp(50, 300)}, Convention: stockTank},
		{ID: "egbogah-ng", Property: DeadViscosity, Authors: "Egbogah and Ng", Year: 1990,
			Reference: "Egbogah, E.O. and Ng, J.T.: An Improved Temperature-Viscosity Correlation for Crude Oil Systems, J. Petrol. Sci. Eng. 4 (3): 197–200 (1990)",
			Ranges:    []Range{api(5, 58), temp(59, 176)}, Convention: stockTank},
		{ID: "kartoatmodjo-schmidt", Property: DeadViscosity, Authors: "Kartoatmodjo and Schmidt", Year: 1994, Reference: refKS,
			Ranges: []Range{api(14.4, 59), temp(80, 320)}, Convention: stockTank},
		{ID: "petrosky-farshad", Property: DeadViscosity, Authors: "Petrosky and Farshad", Year: 1995, Reference: refPF,
			Ranges: []Range{api(25.4, 46.1), temp(114, 288)}, Convention: stockTank},

		// Saturated (live) oil.
		{ID: "chew-connally", Property: SatViscosity, Authors: "Chew and Connally", Year: 1959,
			Reference:  "Chew, J. and Connally, C.A. Jr.: A Viscosity Correlation for Gas-Saturated Crude Oils, Trans. AIME 216: 23–25 (1959)",
			Ranges:     []Range{rs(51, 3544), mud(0.377, 50), temp(72, 292), pr(132, 5645)},
			Convention: "usual fits of A and B to the chart; the A fit turns upward above Rs ≈ 1,680 scf/STB"},
		{ID: "beggs-robinson", Property: SatViscosity, Authors: "Beggs and Robinson", Year: 1975, Reference: refBR,
			Ranges:     []Range{rs(20, 2070), api(16, 58), temp(70, 295), pr(15, 5265)},
			Convention: "dead-oil viscosity at the same temperature"},
		{ID: "kartoatmodjo-schmidt", Property: SatViscosity, Authors: "Kartoatmodjo and Schmidt", Year: 1994, Reference: refKS,
			Ranges:     []Range{rs(0, 2890), mud(0.506, 682)},
			Convention: "dead-oil viscosity at the same temperature"},
		{ID: "petrosky-farshad", Property: SatViscosity, Authors: "Petrosky and Farshad", Year: 1995, Reference: refPF,
			Ranges:     []Range{rs(21, 1885), mud(0.725, 11.69)},
			Convention: "dead-oil viscosity at the same temperature"},

		// Undersaturated oil.
		{ID: "vasquez-beggs", Property: UnderViscosity, Authors: "Vasquez and Beggs", Year: 1980,
			Reference:  "Vasquez, M. and Beggs, H.D.: Correlations for Fluid Physical Property Prediction, J. Petrol. Technol. 32 (6): 968–970 (1980), SPE 6719",
			Ranges:     []Range{pr(141, 9515), api(15.3, 59.5), {Input: "gas gravity", Unit: "", Min: 0.511, Max: 1.351}, rs(9.3, 2199)},
			Convention: atPb},
		{ID: "beal", Property: UnderViscosity, Authors: "Beal", Year: 1946, Reference: refBeal,
			Ranges: []Range{pr(1515, 5515)}, Convention: atPb},
		{ID: "kartoatmodjo-schmidt", Property: UnderViscosity, Authors: "Kartoatmodjo and Schmidt", Year: 1994, Reference: refKS,
			Ranges: []Range{pr(24.7, 6014.7)}, Convention: atPb},
		{ID: "petrosky-farshad", Property: UnderViscosity, Authors: "Petrosky and Farshad", Year: 1995, Reference: refPF,
			Ranges: []Range{pr(1600, 10250)}, Convention: atPb},
	}
}

var (
	deadViscosityFamilies = []DeadViscosityFamily{
		{ID: "beal", Viscosity: BealDeadViscosity, Coefficients: BealDeadCoefficients, ViscosityWith: BealDeadViscosityWith},
		{ID: "beggs-robinson", Viscosity: BeggsRobinsonDeadViscosity,
			Coefficients: BeggsRobinsonDeadCoefficients, ViscosityWith: BeggsRobinsonDeadViscosityWith},
		{ID: "glaso", Viscosity: GlasoDeadViscosity, Coefficients: GlasoDeadCoefficients, ViscosityWith: GlasoDeadViscosityWith},
		{ID: "egbogah-ng", Viscosity: EgbogahNgDeadViscosity, Coefficients: EgbogahNgCoefficients, ViscosityWith: EgbogahNgDeadViscosityWith},
		{ID: "kartoatmodjo-schmidt", Viscosity: KartoatmodjoSchmidtDeadViscosity,
			Coefficients: KartoatmodjoSchmidtDeadCoefficients, ViscosityWith: KartoatmodjoSchmidtDeadViscosityWith},
		{ID: "petrosky-farshad", Viscosity: PetroskyFarshadDeadViscosity,
			Coefficients: PetroskyFarshadDeadCoefficients, ViscosityWith: PetroskyFarshadDeadViscosityWith},
	}
	satViscosityFamilies = []SatViscosityFamily{
		{ID: "chew-connally", Viscosity: ChewConnallySatViscosity,
			Coefficients: ChewConnallyCoefficients, ViscosityWith: ChewConnallySatViscosityWith},
		{ID: "beggs-robinson", Viscosity: BeggsRobinsonSatViscosity,
			Coefficients: BeggsRobinsonSatCoefficients, ViscosityWith: BeggsRobinsonSatViscosityWith},
		{ID: "kartoatmodjo-schmidt", Viscosity: KartoatmodjoSchmidtSatViscosity,
			Coefficients: KartoatmodjoSchmidtSatCoefficients, ViscosityWith: KartoatmodjoSchmidtSatViscosityWith},
		{ID: "petrosky-farshad", Viscosity: PetroskyFarshadSatViscosity,
			Coefficients: PetroskyFarshadSatCoefficients, ViscosityWith: PetroskyFarshadSatViscosityWith},
	}
	underViscosityFamilies = []UnderViscosityFamily{
		{ID: "vasquez-beggs", Viscosity: VasquezBeggsUnderViscosity},
		{ID: "beal", Viscosity: BealUnderViscosity},
		{ID: "kartoatmodjo-schmidt", Viscosity: KartoatmodjoSchmidtUnderViscosity},
		{ID: "petrosky-farshad", Viscosity: PetroskyFarshadUnderViscosity},
	}
)

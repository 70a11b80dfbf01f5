package correlations

// gasEntries lists the natural-gas correlations. Ranges marked "from memory" in the comments
// were not checked against the original paper.
func gasEntries() []Entry {
	return []Entry{
		{
			ID: "sutton", Property: PseudoCritical, Authors: "Sutton", Year: 1985,
			Reference: "Sutton, R.P.: Compressibility Factors for High-Molecular-Weight Reservoir Gases, SPE 14265 (1985)",
			// 264 gas samples (Mokhatab et al., Handbook of Natural Gas Transmission and Processing).
			Ranges:     []Range{{Input: "gas gravity", Unit: "", Min: 0.57, Max: 1.68}},
			Convention: "hydrocarbon gas gravity (air = 1); correct for H2S and CO2 with wichert-aziz",
		},
		{
			ID: "standing", Property: PseudoCritical, Authors: "Standing", Year: 1977,
			Reference: "Standing, M.B.: Volumetric and Phase Behavior of Oil Field Hydrocarbon Systems, SPE, Dallas (1977), pp. 125–126",
			// From memory: the natural-gas curve smooths California gases of about 0.57–1.7 gravity.
			Ranges:     []Range{{Input: "gas gravity", Unit: "", Min: 0.57, Max: 1.7}},
			Convention: "natural-gas (dry-gas) curve, not the gas-condensate curve; correct for H2S and CO2 with wichert-aziz",
		},
		{
			ID: "wichert-aziz", Property: SourCorrection, Authors: "Wichert and Aziz", Year: 1972,
			Reference: "Wichert, E. and Aziz, K.: Calculate Z's for Sour Gases, Hydrocarbon Processing 51 (5): 119–122 (1972)",
			// Mokhatab et al., Handbook of Natural Gas Transmission and Processing.
			Ranges: []Range{
				{Input: "p", Unit: "psia", Min: 154, Max: 7026},
				{Input: "temperature", Unit: "°F", Min: 40, Max: 300},
			},
			Convention: "H2S and CO2 as mole fractions; data up to 73.8 % H2S and 54.4 % CO2",
		},
		{
			ID: "dak", Property: GasZ, Authors: "Dranchuk and Abou-Kassem", Year: 1975,
			Reference: "Dranchuk, P.M. and Abou-Kassem, J.H.: Calculation of Z Factors for Natural Gases Using Equations of State, J. Can. Petrol. Technol. 14 (3): 34–36 (1975)",
			Ranges: []Range{
				{Input: "Tpr", Unit: "", Min: 1.0, Max: 3.0},
				{Input: "Ppr", Unit: "", Min: 0.2, Max: 30},
			},
			Convention: "fit of the Standing–Katz chart; pseudo-reduced from gas-gravity pseudo-criticals",
		},
		{
			ID: "hall-yarborough", Property: GasZ, Authors: "Hall and Yarborough", Year: 1973,
			Reference: "Hall, K.R. and Yarborough, L.: A New Equation of State for Z-factor Calculations, Oil and Gas Journal 71 (25): 82–92 (1973)",
			// Accurate to 0.3 % on average excluding the 1.05–1.15 isotherms of the chart
			// (Ppr up to 15), per the paper's summary.
			Ranges: []Range{
				{Input: "Tpr", Unit: "", Min: 1.2, Max: 3.0},
				{Input: "Ppr", Unit: "", Min: 0, Max: 15},
			},
			Convention: "fit of the Standing–Katz chart; pseudo-reduced from gas-gravity pseudo-criticals",
		},
		{
			ID: "lee-gonzalez-eakin", Property: GasViscosity, Authors: "Lee, Gonzalez and Eakin", Year: 1966,
			Reference: "Lee, A.L., Gonzalez, M.H. and Eakin, B.E.: The Viscosity of Natural Gases, J. Petrol. Technol. 18 (8): 997–1000 (1966), SPE 1340",
			// From memory: four natural gases, 100–340 °F, 100–8,000 psia.
			Ranges: []Range{
				{Input: "temperature", Unit: "°F", Min: 100, Max: 340},
				{Input: "p", Unit: "psia", Min: 100, Max: 8000},
			},
			Convention: "gas density from Z (real-gas law) with M = 28.96·γg",
		},
	}
}

var (
	pseudoCriticalFamilies = []PseudoCriticalFamily{
		{ID: "sutton", Critical: SuttonCritical},
		{ID: "standing", Critical: StandingCritical},
	}
	zFamilies = []ZFamily{
		{ID: "dak", Z: DranchukAbouKassem},
		{ID: "hall-yarborough", Z: HallYarborough},
	}
)

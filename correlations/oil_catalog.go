package correlations

// Catalog entries and family lists of the oil correlations (solution gas, saturated Bo, oil
// compressibility). Data ranges are those commonly quoted for each author's original data set;
// most are from memory (see each function's doc comment) and serve only to warn about
// extrapolation.

// rng builds the ranges of one entry; the order of inputs is API, gas gravity, temperature,
// Rsb, Pb.
func rng(api0, api1, gg0, gg1, t0, t1, rs0, rs1, pb0, pb1 float64) []Range {
	return []Range{
		{Input: "API", Unit: "°API", Min: api0, Max: api1},
		{Input: "gas gravity", Unit: "", Min: gg0, Max: gg1},
		{Input: "temperature", Unit: "°F", Min: t0, Max: t1},
		{Input: "Rsb", Unit: "scf/STB", Min: rs0, Max: rs1},
		{Input: "Pb", Unit: "psia", Min: pb0, Max: pb1},
	}
}

// withP appends the range of the pressure p to a copy of r.
func withP(r []Range, p0, p1 float64) []Range {
	return append(append([]Range(nil), r...), Range{Input: "p", Unit: "psia", Min: p0, Max: p1})
}

const (
	refStanding = "M.B. Standing, \"A Pressure-Volume-Temperature Correlation for Mixtures of California Oils and Gases\", Drilling and Production Practice, API (1947), 275–287"
	refVB       = "M. Vasquez and H.D. Beggs, \"Correlations for Fluid Physical Property Prediction\", J. Pet. Tech. 32 (June 1980) 968–970, SPE 6719"
	refGlaso    = "Ø. Glasø, \"Generalized Pressure-Volume-Temperature Correlations\", J. Pet. Tech. 32 (May 1980) 785–795, SPE 8016"
	refMarhoun  = "M.A. Al-Marhoun, \"PVT Correlations for Middle East Crude Oils\", J. Pet. Tech. 40 (May 1988) 650–666, SPE 13718"
	refPF       = "G.E. Petrosky Jr. and F.F. Farshad, \"Pressure-Volume-Temperature Correlations for Gulf of Mexico Crude Oils\", SPE 26644, SPE Annual Technical Conference, Houston (1993)"
	refKS       = "T. Kartoatmodjo and Z. Schmidt, \"Large Data Bank Improves Crude Physical Property Correlations\", Oil & Gas Journal 92 (4 July 1994) 51–55"
	refLasater  = "J.A. Lasater, \"Bubble Point Pressure Correlation\", Trans. AIME 213 (1958) 379–381"
	refVM       = "P.P. Valkó and W.D. McCain Jr., \"Reservoir Oil Bubblepoint Pressures Revisited; Solution Gas–Oil Ratios and Surface Gas Specific Gravities\", J. Pet. Sci. Eng. 37 (2003) 153–169; Rs shape: J. Velarde, T.A. Blasingame and W.D. McCain Jr., \"Correlation of Black Oil Properties at Pressures Below Bubble Point Pressure — A New Approach\", Petroleum Society paper 97-93 (1997)"
	refMH       = "W.D. McCain Jr. and N.C. Hill, \"Correlations for Liquid Densities and Evolved Gas Specific Gravities for Black Oils During Pressure Depletion\", SPE 30773 (1995); method of W.D. McCain Jr., The Properties of Petroleum Fluids, 2nd ed., PennWell (1990)"
	refSVM      = "J.P. Spivey, P.P. Valkó and W.D. McCain, \"Applications of the Coefficient of Isothermal Compressibility to Various Reservoir Situations With New Correlations for Each Situation\", SPE Res. Eval. & Eng. 10 (Feb. 2007) 43–49, SPE 96415"
	refMRV      = "W.D. McCain Jr., J.B. Rollins and A.J. Villena Lanzi, \"The Coefficient of Isothermal Compressibility of Black Oils at Pressures Below the Bubblepoint\", SPE Formation Evaluation 3 (Sept. 1988) 659–662, SPE 15664"

	convVB = "first-stage separator gas gravity normalised to a 100 psig (114.7 psia) separator: γgs = γg·[1 + 5.912e−5·API·Tsep·log10(psep/114.7)], Tsep in °F; unknown separator conditions are taken as 114.7 psia and 60 °F (no correction); coefficient sets for API ≤ 30 and API > 30"
	convKS = "first-stage separator gas gravity normalised to a 100 psig separator: γg100 = γg·[1 + 0.1595·API^0.4078·Tsep^−0.2466·log10(psep/114.7)], Tsep in °F; unknown separator conditions are taken as 114.7 psia and 60 °F; coefficient sets for API ≤ 30 and API > 30"
)

var (
	rangesStanding = rng(16.5, 63.8, 0.59, 0.95, 100, 258, 20, 1425, 130, 7000)
	rangesVB       = rng(16, 58, 0.56, 1.18, 70, 295, 20, 2070, 50, 5250)
	rangesGlaso    = rng(22.3, 48.1, 0.650, 1.276, 80, 280, 90, 2637, 165, 7142)
	rangesMarhoun  = rng(19.4, 44.6, 0.752, 1.367, 74, 240, 26, 1602, 130, 3573)
	rangesPF       = rng(16.3, 45, 0.578, 0.852, 114, 288, 217, 1406, 1574, 6523)
	rangesKS       = rng(14.4, 58.9, 0.379, 1.709, 75, 320, 0, 2890, 14.7, 6055)
	rangesLasater  = rng(17.9, 51.1, 0.574, 1.223, 82, 272, 3, 2905, 48, 5780)
	rangesVM       = rng(6, 63.7, 0.555, 1.685, 74, 342, 10, 2216, 32, 6700)
	// The original data ranges of McCain and Hill (1995) and of Spivey, Valkó and McCain (2007)
	// could not be checked; the Valkó–McCain (2003) bubble-point data set, from the same
	// laboratory data base, stands in for them (said in each Convention).
	rangesMH  = rangesVM
	rangesSVM = rangesVM
	rangesMRV = rng(18, 52, 0.58, 1.20, 78, 330, 15, 1947, 763, 5300)
)

func oilEntries() []Entry {
	return []Entry{
		// Solution gas: Pb(Rsb) and its exact inverse Rs(p).
		{ID: "standing", Property: SolutionGas, Gravity: TotalGas, Authors: "Standing", Year: 1947, Reference: refStanding, Ranges: rangesStanding,
			Convention: "published as Pb(Rsb); Rs(p) is its closed-form inverse"},
		{ID: "vasquez-beggs", Property: SolutionGas, Gravity: FirstStageGas, Authors: "Vasquez and Beggs", Year: 1980, Reference: refVB, Ranges: rangesVB,
			Convention: "published as Rs(p); Pb is its closed-form inverse; " + convVB},
		{ID: "glaso", Property: SolutionGas, Gravity: TotalGas, Authors: "Glasø", Year: 1980, Reference: refGlaso, Ranges: rangesGlaso,
			Convention: "published as Pb(Rsb) (log-quadratic, paraffinicity exponent 0.989, no non-hydrocarbon correction); Rs(p) is its closed-form inverse on the rising branch"},
		{ID: "al-marhoun", Property: SolutionGas, Gravity: TotalGas, Authors: "Al-Marhoun", Year: 1988, Reference: refMarhoun, Ranges: rangesMarhoun,
			Convention: "published as Pb(Rsb); Rs(p) is its closed-form inverse; temperature in °R inside the correlation"},
		{ID: "petrosky-farshad", Property: SolutionGas, Gravity: TotalGas, Authors: "Petrosky and Farshad", Year: 1993, Reference: refPF, Ranges: rangesPF,
			Convention: "published as Pb(Rsb); Rs(p) is its closed-form inverse"},
		{ID: "kartoatmodjo-schmidt", Property: SolutionGas, Gravity: FirstStageGas, Authors: "Kartoatmodjo and Schmidt", Year: 1994, Reference: refKS, Ranges: rangesKS,
			Convention: "published as Rs(p); Pb is its closed-form inverse; " + convKS},
		{ID: "lasater", Property: SolutionGas, Gravity: TotalGas, Authors: "Lasater", Year: 1958, Reference: refLasater, Ranges: rangesLasater,
			Convention: "published as a chart of Pb·γg/T against gas mole fraction; common curve fits used, Rs(p) inverts them in closed form; stock-tank oil molecular weight from the API chart fit"},
		{ID: "valko-mccain", Property: SolutionGas, Gravity: SeparatorGas, Authors: "Valkó and McCain", Year: 2003, Reference: refVM, Ranges: rangesVM,
			Convention: "published as Pb(Rsb); below Pb the published companion, Velarde, Blasingame and McCain's Rs(p; Pb, Rsb), drawn through the Valkó–McCain Pb of the oil's Rsb, with Pb(Rs) its numerical inverse (Brent); both take the separator gas gravity (every stage ahead of the stock tank)"},

		// Saturated oil formation volume factor.
		{ID: "standing", Property: OilFVF, Gravity: TotalGas, Authors: "Standing", Year: 1947, Reference: refStanding, Ranges: rangesStanding,
			Convention: "original form 0.9759 + 1.2e−4·F^1.2"},
		{ID: "vasquez-beggs", Property: OilFVF, Gravity: FirstStageGas, Authors: "Vasquez and Beggs", Year: 1980, Reference: refVB, Ranges: rangesVB, Convention: convVB},
		{ID: "glaso", Property: OilFVF, Gravity: TotalGas, Authors: "Glasø", Year: 1980, Reference: refGlaso, Ranges: rangesGlaso},
		{ID: "al-marhoun", Property: OilFVF, Gravity: TotalGas, Authors: "Al-Marhoun", Year: 1988, Reference: refMarhoun, Ranges: rangesMarhoun,
			Convention: "temperature in °R inside the correlation"},
		{ID: "petrosky-farshad", Property: OilFVF, Gravity: TotalGas, Authors: "Petrosky and Farshad", Year: 1993, Reference: refPF, Ranges: rangesPF},
		{ID: "kartoatmodjo-schmidt", Property: OilFVF, Gravity: FirstStageGas, Authors: "Kartoatmodjo and Schmidt", Year: 1994, Reference: refKS, Ranges: rangesKS, Convention: convKS},
		{ID: "mccain-density", Property: OilFVF, Gravity: TotalGas, Authors: "McCain and Hill", Year: 1995, Reference: refMH, Ranges: rangesMH,
			Convention: "Bo = (62.37·γo + 0.01357·Rs·γg)/ρo with ρo from the pseudo-liquid density iteration and pressure and temperature corrections; uses the pressure; gas gravity taken as the separator gas; ranges are those of the Valkó–McCain (2003) data set, standing in for the unverified original ones"},

		// Oil compressibility.
		{ID: "vasquez-beggs", Property: Compressibility, Gravity: FirstStageGas, Authors: "Vasquez and Beggs", Year: 1980, Reference: refVB,
			Ranges: withP(rngCo(9.3, 58.9, 0.511, 1.351, 74, 320, 9.3, 2199), 126, 9500), Convention: "instantaneous co = A/p; " + convVB},
		{ID: "petrosky-farshad", Property: Compressibility, Gravity: TotalGas, Authors: "Petrosky and Farshad", Year: 1993, Reference: refPF,
			Ranges: withP(rangesPF, 1700, 10692), Convention: "instantaneous co, a power law in p"},
		{ID: "spivey-valko-mccain", Property: Compressibility, Gravity: SeparatorGas, Authors: "Spivey, Valkó and McCain", Year: 2007, Reference: refSVM,
			Ranges:     withP(rangesSVM, 100, 10000),
			Convention: "the correlation gives the average co from Pb to p (Bo = Bob·exp[−c̄o·(p − Pb)]); Co is the instantaneous value derived from it; ranges are those of the Valkó–McCain (2003) data set, standing in for the unverified original ones"},
		{ID: "mccain-rollins-villena", Property: CoBelowPb, Authors: "McCain, Rollins and Villena", Year: 1988, Reference: refMRV,
			Ranges:     withP(rangesMRV, 500, 5300),
			Convention: "co below the bubble point (p ≤ Pb), including liberated gas; temperature in °R; no relative volume above Pb"},
	}
}

// rngCo is rng without the Pb range, for entries whose data set is not described by Pb.
func rngCo(api0, api1, gg0, gg1, t0, t1, rs0, rs1 float64) []Range {
	return rng(api0, api1, gg0, gg1, t0, t1, rs0, rs1, 0, 0)[:4]
}

var (
	solutionGasFamilies = []SolutionGasFamily{
		{ID: "standing", BubblePoint: StandingBubblePoint, SolutionGOR: StandingSolutionGOR,
			Coefficients: StandingCoefficients, BubblePointWith: StandingBubblePointWith, SolutionGORWith: StandingSolutionGORWith},
		{ID: "vasquez-beggs", BubblePoint: VasquezBeggsBubblePoint, SolutionGOR: VasquezBeggsSolutionGOR,
			Coefficients: VasquezBeggsCoefficients, BubblePointWith: VasquezBeggsBubblePointWith, SolutionGORWith: VasquezBeggsSolutionGORWith},
		{ID: "glaso", BubblePoint: GlasoBubblePoint, SolutionGOR: GlasoSolutionGOR,
			Coefficients: GlasoCoefficients, BubblePointWith: GlasoBubblePointWith, SolutionGORWith: GlasoSolutionGORWith},
		{ID: "al-marhoun", BubblePoint: AlMarhounBubblePoint, SolutionGOR: AlMarhounSolutionGOR,
			Coefficients: AlMarhounCoefficients, BubblePointWith: AlMarhounBubblePointWith, SolutionGORWith: AlMarhounSolutionGORWith},
		{ID: "petrosky-farshad", BubblePoint: PetroskyFarshadBubblePoint, SolutionGOR: PetroskyFarshadSolutionGOR,
			Coefficients: PetroskyFarshadCoefficients, BubblePointWith: PetroskyFarshadBubblePointWith, SolutionGORWith: PetroskyFarshadSolutionGORWith},
		{ID: "kartoatmodjo-schmidt", BubblePoint: KartoatmodjoSchmidtBubblePoint, SolutionGOR: KartoatmodjoSchmidtSolutionGOR,
			Coefficients: KartoatmodjoSchmidtCoefficients, BubblePointWith: KartoatmodjoSchmidtBubblePointWith, SolutionGORWith: KartoatmodjoSchmidtSolutionGORWith},
		{ID: "lasater", BubblePoint: LasaterBubblePoint, SolutionGOR: LasaterSolutionGOR},
		{ID: "valko-mccain", BubblePoint: ValkoMcCainPairBubblePoint, SolutionGOR: ValkoMcCainPairSolutionGOR,
			Coefficients: VelardeCoefficients, BubblePointWith: ValkoMcCainPairBubblePointWith, SolutionGORWith: ValkoMcCainPairSolutionGORWith},
	}

	oilFVFFamilies = []OilFVFFamily{
		{ID: "standing", FVF: StandingOilFVF, Coefficients: StandingFVFCoefficients, FVFWith: StandingOilFVFWith},
		{ID: "vasquez-beggs", FVF: VasquezBeggsOilFVF},
		{ID: "glaso", FVF: GlasoOilFVF, Coefficients: GlasoFVFCoefficients, FVFWith: GlasoOilFVFWith},
		{ID: "al-marhoun", FVF: AlMarhounOilFVF, Coefficients: AlMarhounFVFCoefficients, FVFWith: AlMarhounOilFVFWith},
		{ID: "petrosky-farshad", FVF: PetroskyFarshadOilFVF, Coefficients: PetroskyFarshadFVFCoefficients, FVFWith: PetroskyFarshadOilFVFWith},
		{ID: "kartoatmodjo-schmidt", FVF: KartoatmodjoSchmidtOilFVF, Coefficients: KartoatmodjoSchmidtFVFCoefficients, FVFWith: KartoatmodjoSchmidtOilFVFWith},
		{ID: "mccain-density", FVF: McCainOilFVF},
	}

	// compressibilityFamilies holds the undersaturated families and, last, the below-Pb
	// family mccain-rollins-villena (its id is unique across both properties).
	compressibilityFamilies = []CompressibilityFamily{
		{ID: "vasquez-beggs", Co: VasquezBeggsCo, RelativeVolume: VasquezBeggsRelativeVolume},
		{ID: "petrosky-farshad", Co: PetroskyFarshadCo, RelativeVolume: PetroskyFarshadRelativeVolume},
		{ID: "spivey-valko-mccain", Co: SpiveyCo, RelativeVolume: SpiveyRelativeVolume},
		{ID: "mccain-rollins-villena", Co: McCainRollinsVillenaCo, RelativeVolume: McCainRollinsVillenaRelativeVolume},
	}
)

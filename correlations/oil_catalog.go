package correlations

// Placeholder until the oil correlations land: empty lists.

func oilEntries() []Entry { return nil }

var (
	solutionGasFamilies     []SolutionGasFamily
	oilFVFFamilies          []OilFVFFamily
	compressibilityFamilies []CompressibilityFamily
)

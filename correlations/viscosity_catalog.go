package correlations

// Placeholder until the viscosity correlations land: empty lists.

func viscosityEntries() []Entry { return nil }

var (
	deadViscosityFamilies  []DeadViscosityFamily
	satViscosityFamilies   []SatViscosityFamily
	underViscosityFamilies []UnderViscosityFamily
)

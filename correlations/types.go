package correlations

// Property names what a catalog entry estimates.
type Property string

// The properties of the catalog. The ids of DESIGN.md §4 are unique within a property.
const (
	SolutionGas     Property = "pb"       // bubble point Pb(Rsb) with its inverse Rs(p)
	OilFVF          Property = "bo"       // saturated oil formation volume factor
	Compressibility Property = "co"       // undersaturated oil compressibility (p > Pb)
	CoBelowPb       Property = "co_sat"   // oil compressibility below Pb
	DeadViscosity   Property = "mu_dead"  // dead-oil viscosity at reservoir temperature
	SatViscosity    Property = "mu_sat"   // saturated (live) oil viscosity
	UnderViscosity  Property = "mu_under" // undersaturated oil viscosity
	PseudoCritical  Property = "ppc"      // gas pseudo-critical pressure and temperature
	SourCorrection  Property = "sour"     // pseudo-critical correction for H2S and CO2
	GasZ            Property = "z"        // gas compressibility factor
	GasViscosity    Property = "mu_gas"   // gas viscosity
)

// Oil describes the fluid that the oil correlations need besides pressure and Rs.
//
// The gas gravities: each family takes the one its paper defines (Entry.Gravity): the total
// surface gas (GasGravity), the gas of the first separator stage (SepGasGravity), or the gas of
// every separator stage ahead of the stock tank (SepStagesGasGravity). For a single flash to the
// stock tank the separator is the stock tank itself.
type Oil struct {
	API            float64 // stock-tank oil gravity, °API
	GasGravity     float64 // total surface gas gravity (GOR-weighted over every stage, stock tank included), air = 1
	Temperature    float64 // reservoir temperature, °F
	SepPressure    float64 // first-stage separator pressure, psia; 0 means unknown (114.7 is used)
	SepTemperature float64 // first-stage separator temperature, °F; 0 means unknown (60 is used)
	// SepGasGravity is the gravity of the first-stage separator gas, which the families that
	// normalise the gas gravity to a 100 psig separator (Vasquez–Beggs, Kartoatmodjo–Schmidt)
	// take; 0 means unknown (GasGravity is used).
	SepGasGravity float64
	// SepStagesGasGravity is the GOR-weighted gravity of the gas of every separator stage ahead
	// of the stock tank (the "separator gas" of Valkó–McCain, Velarde and Spivey–Valkó–McCain);
	// 0 means unknown (GasGravity is used).
	SepStagesGasGravity float64
	// Rsb is the solution GOR at the bubble point of the oil (scf/STB), for families whose Rs
	// below Pb is drawn through the oil's own bubble point (valko-mccain, after Velarde); 0
	// means unknown.
	Rsb float64
}

// GravityKind names which surface gas gravity a family takes (see Oil).
type GravityKind string

// The gravity kinds.
const (
	TotalGas      GravityKind = "total surface gas"
	FirstStageGas GravityKind = "first-stage separator gas"
	SeparatorGas  GravityKind = "separator gas (every stage ahead of the stock tank)"
)

// separatorGasGravity returns the gravity of the separator gas without the stock tank, or
// GasGravity when it is unknown.
func (o Oil) separatorGasGravity() float64 {
	if o.SepStagesGasGravity > 0 {
		return o.SepStagesGasGravity
	}
	return o.GasGravity
}

// firstStageGasGravity returns the first-stage separator gas gravity, or GasGravity when it
// is unknown.
func (o Oil) firstStageGasGravity() float64 {
	if o.SepGasGravity > 0 {
		return o.SepGasGravity
	}
	return o.GasGravity
}

// OilGravity returns the stock-tank oil specific gravity (water = 1) from API gravity:
// γo = 141.5/(131.5 + API) (API definition, common practice).
func (o Oil) OilGravity() float64 { return 141.5 / (131.5 + o.API) }

// Range is the span of one input in a correlation's original data set.
type Range struct {
	Input string  // input name as shown to the user: "API", "gas gravity", "temperature", "Rsb", "p"
	Unit  string  // unit of Min and Max: "°API", "", "°F", "scf/STB", "psia"
	Min   float64 // smallest value in the original data
	Max   float64 // largest value in the original data
}

// Entry is one line of the catalog.
type Entry struct {
	ID         string   // stable id used in files and flags, for example "standing"
	Property   Property // what the entry estimates
	Authors    string   // "Standing", "Vasquez and Beggs"
	Year       int      // year of publication
	Reference  string   // the published reference
	Ranges     []Range  // input ranges of the original data set
	Convention string   // input convention the correlation assumes, if any
	// Gravity is the gas gravity the family takes; "" for families that take none.
	Gravity GravityKind
}

// Coefficient is one published constant of a family that the refit depth may change. A
// family declares its coefficients beside its functions; its With functions take a value for
// each, in the declared order.
type Coefficient struct {
	ID    string  // short name, unique within the family: "offset", "c2_light"
	Value float64 // the published value
	Role  string  // where it sits in the published equation, for the user
}

// Published returns the published values of a coefficient list, in order.
func Published(cs []Coefficient) []float64 {
	v := make([]float64, len(cs))
	for i, c := range cs {
		v[i] = c.Value
	}
	return v
}

// SolutionGasFamily is a mutually consistent pair: BubblePoint(Rsb) and its exact inverse
// SolutionGOR(p) for p at or below the bubble point. A family that declares Coefficients
// also gives the pair with other coefficient values (BubblePointWith, SolutionGORWith, still an
// exact inverse pair); the plain functions are the With functions at the published values.
type SolutionGasFamily struct {
	ID          string
	BubblePoint func(rsb float64, o Oil) (float64, error) // psia
	SolutionGOR func(p float64, o Oil) (float64, error)   // scf/STB

	Coefficients    []Coefficient
	BubblePointWith func(rsb float64, o Oil, c []float64) (float64, error)
	SolutionGORWith func(p float64, o Oil, c []float64) (float64, error)
}

// OilFVFFamily gives the saturated oil formation volume factor (rb/STB) of oil holding rs
// scf/STB at pressure p (psia) and o.Temperature. Most families ignore p.
type OilFVFFamily struct {
	ID  string
	FVF func(p, rs float64, o Oil) (float64, error)

	Coefficients []Coefficient // declared refit coefficients; nil when the family has none
	FVFWith      func(p, rs float64, o Oil, c []float64) (float64, error)
}

// CompressibilityFamily gives the isothermal oil compressibility (1/psi) at p for an oil
// with bubble point pb and solution GOR at the bubble point rsb, and RelativeVolume, the
// ratio Bo(p)/Bo(pb) = exp(−∫ co dp from pb to p), for p ≥ pb (undersaturated families).
type CompressibilityFamily struct {
	ID             string
	Co             func(p, pb, rsb float64, o Oil) (float64, error)
	RelativeVolume func(p, pb, rsb float64, o Oil) (float64, error)
}

// DeadViscosityFamily gives the dead-oil viscosity (cP) at o.Temperature. A family that
// declares Coefficients also gives ViscosityWith, the viscosity with other coefficient values;
// Viscosity is ViscosityWith at the published values.
type DeadViscosityFamily struct {
	ID        string
	Viscosity func(o Oil) (float64, error)

	Coefficients  []Coefficient // declared refit coefficients; nil when the family has none
	ViscosityWith func(o Oil, c []float64) (float64, error)
}

// SatViscosityFamily gives the live-oil viscosity (cP) of a saturated oil holding rs scf/STB
// whose dead-oil viscosity is muDead. Coefficients and ViscosityWith as for
// DeadViscosityFamily.
type SatViscosityFamily struct {
	ID        string
	Viscosity func(muDead, rs float64, o Oil) (float64, error)

	Coefficients  []Coefficient // declared refit coefficients; nil when the family has none
	ViscosityWith func(muDead, rs float64, o Oil, c []float64) (float64, error)
}

// UnderViscosityFamily gives the viscosity (cP) at p ≥ pb of an oil whose viscosity at its
// bubble point pb is muB.
type UnderViscosityFamily struct {
	ID        string
	Viscosity func(p, pb, muB float64, o Oil) (float64, error)
}

// PseudoCriticalFamily gives the pseudo-critical pressure (psia) and temperature (°R) of a
// natural gas from its gravity.
type PseudoCriticalFamily struct {
	ID       string
	Critical func(gasGravity float64) (ppc, tpc float64, err error)
}

// ZFamily gives the gas compressibility factor from pseudo-reduced temperature and pressure.
type ZFamily struct {
	ID string
	Z  func(tpr, ppr float64) (float64, error)
}

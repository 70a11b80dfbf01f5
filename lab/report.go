package lab

// Report is one laboratory PVT report, in field units (psia, °F, scf/STB, rb/STB, cP,
// lbm/ft³). Optional measured values that a report does not give are 0: every such
// quantity is strictly positive when measured.
type Report struct {
	Dir         string // folder it was read from, "" when built in code
	Fingerprint string // SHA-256 over the input files as read, hex; "" when built in code
	Fluid       Fluid
	DL          []DLStage        // highest pressure first, then down to atmospheric
	Separator   []SeparatorTest  // in file order
	CCE         []CCEPoint       // in file order
	Viscosity   []ViscosityPoint // in file order
}

// Fluid is the fluid description of fluid.csv.
type Fluid struct {
	Sample         string         // sample id or name
	Temperature    float64        // reservoir temperature, °F
	Pb             float64        // saturation (bubble-point) pressure reported, psia
	API            float64        // stock-tank oil gravity, °API
	ResidualAPI    float64        // gravity of the DL's residual oil at 60 °F, °API; 0 when not given (API is used)
	SepGasGravity  float64        // separator gas gravity (air = 1); 0: compute from separator.csv
	H2S, CO2, N2   float64        // mole percent in the reservoir gas; 0 when not given
	StdPressure    float64        // standard pressure, psia (default 14.696)
	StdTemperature float64        // standard temperature, °F (default 60)
	SelectedTest   string         // separator test used for the field; "" = smallest Bofb
	Line           map[string]int // fluid.csv line of each key given, by canonical key
}

// DLStage is one row of dl.csv.
type DLStage struct {
	Line       int     // line in dl.csv (0 when built in code)
	Pressure   float64 // psia
	Residual60 bool    // the residual-oil row corrected to 60 °F
	Rsd        float64 // solution gas, scf per bbl of residual oil
	Bod        float64 // relative oil volume, bbl per bbl of residual oil
	Bt         float64 // relative total volume; 0 when not reported
	OilDensity float64 // lbm/ft³; 0 when not reported
	Z          float64 // of the liberated gas; 0 when not reported
	Bg         float64 // rcf/scf; 0 when not reported
	GasGravity float64 // of the gas liberated at this stage; 0 when not reported
}

// SeparatorTest is one multi-stage separator test of separator.csv.
type SeparatorTest struct {
	ID     string
	Stages []SeparatorStage // in file order, stock tank last
	Bofb   float64          // rb of saturated oil per STB
	API    float64          // stock-tank oil gravity, °API
}

// SeparatorStage is one stage of a separator test.
type SeparatorStage struct {
	Line        int     // line in separator.csv
	Stage       string  // "1", "2", … or "stock tank"
	Pressure    float64 // psia
	Temperature float64 // °F
	GOR         float64 // scf per STB of stock-tank oil
	GasGravity  float64 // air = 1; 0 when not reported
}

// Rsfb returns the total GOR of the test: the sum of its stage GORs, scf/STB.
func (t SeparatorTest) Rsfb() float64 {
	s := 0.0
	for _, st := range t.Stages {
		s += st.GOR
	}
	return s
}

// SeparatorGasGravity returns the GOR-weighted gravity of the gas of the stages ahead of the
// stock tank (the separator gas), or of the single stage of a test that flashes straight to
// the stock tank; 0 when none reports one.
func (t SeparatorTest) SeparatorGasGravity() float64 {
	stages := t.Stages
	if len(stages) > 1 {
		stages = stages[:len(stages)-1]
	}
	return SeparatorTest{Stages: stages}.GasGravity()
}

// GasGravity returns the GOR-weighted gravity of the gas from every stage that reports one,
// or 0 when none does.
func (t SeparatorTest) GasGravity() float64 {
	var num, den float64
	for _, st := range t.Stages {
		if st.GasGravity > 0 {
			num += st.GOR * st.GasGravity
			den += st.GOR
		}
	}
	if den == 0 {
		return 0
	}
	return num / den
}

// CCEPoint is one row of cce.csv.
type CCEPoint struct {
	Line      int     // line in cce.csv
	Pressure  float64 // psia
	RelVolume float64 // V/Vsat
	Density   float64 // lbm/ft³ (above saturation pressure); 0 when not reported
	Y         float64 // Y-function as reported; 0 when not reported
}

// ViscosityPoint is one row of viscosity.csv.
type ViscosityPoint struct {
	Line     int     // line in viscosity.csv
	Pressure float64 // psia
	Oil      float64 // cP
	Gas      float64 // cP; 0 when not reported
}

// SelectedSeparator returns the separator test used for the field: the one named in
// fluid.csv, or else the one with the smallest Bofb (largest stock-tank yield). ok is false
// when the report has no separator test.
func (r *Report) SelectedSeparator() (t SeparatorTest, ok bool) {
	if len(r.Separator) == 0 {
		return SeparatorTest{}, false
	}
	if r.Fluid.SelectedTest != "" {
		for _, s := range r.Separator {
			if s.ID == r.Fluid.SelectedTest {
				return s, true
			}
		}
	}
	best := r.Separator[0]
	for _, s := range r.Separator[1:] {
		if s.Bofb > 0 && (best.Bofb <= 0 || s.Bofb < best.Bofb) {
			best = s
		}
	}
	return best, true
}

// GasGravity returns the separator gas gravity for the correlations: fluid.csv's value, or
// else the GOR-weighted gravity of the selected separator test, or 0 when neither exists.
func (r *Report) GasGravity() float64 {
	if r.Fluid.SepGasGravity > 0 {
		return r.Fluid.SepGasGravity
	}
	if t, ok := r.SelectedSeparator(); ok {
		return t.GasGravity()
	}
	return 0
}

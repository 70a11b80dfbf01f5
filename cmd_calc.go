package main

import (
	"encoding/json"
	"flag"
	"fmt"
	"io"
	"strings"
	"text/tabwriter"

	"labmatch/correlations"
	"labmatch/fit"
	"labmatch/lab"
)

// quantityFlag is a flag value with an optional unit suffix ("2000psia", "93degC"); a plain
// number is in field units.
type quantityFlag struct {
	q   lab.Quantity
	v   float64
	set bool
}

func (f *quantityFlag) String() string {
	if f == nil || !f.set {
		return ""
	}
	return fmt.Sprint(f.v)
}

func (f *quantityFlag) Set(s string) error {
	v, err := lab.ParseValue(f.q, s)
	if err != nil {
		return err
	}
	f.v, f.set = v, true
	return nil
}

func quantity(fs *flag.FlagSet, name string, q lab.Quantity, def float64, usage string) *quantityFlag {
	f := &quantityFlag{q: q, v: def}
	fs.Var(f, name, usage)
	return f
}

func runCalc(args []string, stdout, stderr io.Writer) int {
	if len(args) > 0 && (args[0] == "oil" || args[0] == "gas") {
		if args[0] == "oil" {
			return runCalcOil(args[1:], stdout, stderr)
		}
		return runCalcGas(args[1:], stdout, stderr)
	}
	fs := newFlagSet("calc", "labmatch calc oil|gas [flags]",
		"Evaluate the published correlations once. \"labmatch calc oil --help\" and\n\"labmatch calc gas --help\" list the flags.")
	if _, code := parseFlags(fs, args, stdout, stderr); code >= 0 {
		return code
	}
	return usageError(fs, stderr, "want \"oil\" or \"gas\"")
}

type oilCalcOut struct {
	PressurePsia     float64  `json:"pressure_psia"`
	PbPsia           float64  `json:"pb_psia"`
	RsScfSTB         float64  `json:"rs_scf_stb"`
	BoRbSTB          *float64 `json:"bo_rb_stb"`
	CoPerPsi         *float64 `json:"co_per_psi"`
	OilDensity       *float64 `json:"oil_density_lbm_ft3"`
	DeadOilViscosity float64  `json:"dead_oil_viscosity_cp"`
	OilViscosity     *float64 `json:"oil_viscosity_cp"`
	Families         any      `json:"families"`
	Warnings         []string `json:"warnings"`
	// NotEvaluated gives, per quantity that could not be evaluated (null above), the reason.
	NotEvaluated map[string]string `json:"not_evaluated"`
}

func runCalcOil(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("calc oil", "labmatch calc oil --api A --gas-gravity G --temperature T --rsb R [--pressure P] [family flags] [--json]",
		"Oil properties at one pressure from the published correlations (no tuning); without\n--pressure, at the bubble point (Pb, Bob, oil density and viscosity at Pb, dead-oil viscosity).\nValues take units: 2000psia, 150bar, 93degC, 107sm3/sm3; plain numbers are field units.")
	api := fs.Float64("api", 0, "stock-tank oil gravity, `degAPI`")
	gg := fs.Float64("gas-gravity", 0, "total surface gas `gravity` (air = 1; every stage, stock tank included), for "+gravityUsers(correlations.TotalGas))
	temp := quantity(fs, "temperature", lab.Temperature, 0, "reservoir `temperature` (default unit degF)")
	rsb := quantity(fs, "rsb", lab.GOR, 0, "solution GOR at the bubble point (default unit scf/STB)")
	press := quantity(fs, "pressure", lab.Pressure, 0, "`pressure` to evaluate at (default unit psia; default: the bubble point)")
	sepGG := fs.Float64("sep-gas-gravity", 0, "first-stage separator gas `gravity`, for "+gravityUsers(correlations.FirstStageGas)+" (default: --gas-gravity)")
	stagesGG := fs.Float64("sep-stages-gas-gravity", 0, "separator gas `gravity` of every stage ahead of the stock tank, for "+gravityUsers(correlations.SeparatorGas)+" (default: --gas-gravity)")
	sepP := quantity(fs, "sep-pressure", lab.Pressure, 114.7, "first-stage separator `pressure`, for the separator-gas normalisations (default 114.7 psia)")
	sepT := quantity(fs, "sep-temperature", lab.Temperature, 60, "first-stage separator `temperature` (default 60 degF)")
	fams := familyFlags(fs, fit.DefaultFamilies, fit.Pb, fit.Bo, fit.Co, fit.MuDead, fit.MuSat, fit.MuUnder)
	asJSON := fs.Bool("json", false, "print JSON")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) > 0 {
		return usageError(fs, stderr, "unexpected argument %q", pos[0])
	}
	for _, req := range []struct {
		name string
		ok   bool
	}{{"--api", *api > 0}, {"--gas-gravity", *gg > 0}, {"--temperature", temp.set}, {"--rsb", rsb.set && rsb.v > 0}, {"--pressure", !press.set || press.v > 0}} {
		if !req.ok {
			return usageError(fs, stderr, "%s is required (and must be above zero)", req.name)
		}
	}
	ds := &fit.Dataset{Oil: correlations.Oil{API: *api, GasGravity: *gg, Temperature: temp.v, SepPressure: sepP.v, SepTemperature: sepT.v,
		SepGasGravity: *sepGG, SepStagesGasGravity: *stagesGG, Rsb: rsb.v},
		Rsb: rsb.v, StdPressure: 14.696, StdTemp: 60}
	choice, err := fams.choice()
	if err != nil {
		return usageError(fs, stderr, "%v", err)
	}
	m, err := fit.PublishedModel(ds, choice, fit.Options{})
	if err != nil {
		fmt.Fprintln(stderr, "labmatch:", err)
		return exitData
	}
	if !press.set {
		press.v = m.Pb
	}
	// A property whose correlation cannot be evaluated for this oil (Vasquez–Beggs co for a
	// low-GOR oil) becomes a remark beside it; the others are still given.
	st, qerrs := m.Evaluate(press.v)
	failed := map[string]string{}
	for _, qe := range qerrs {
		switch qe.Quantity {
		case "Bo", "co", "oil density", "oil viscosity":
			failed[qe.Quantity] = qe.Err.Error()
		case "Z", "Bg", "gas viscosity": // not shown by calc oil
		default:
			fmt.Fprintln(stderr, "labmatch:", qe)
			return exitData
		}
	}
	// Above Pb, Bo comes from the compressibility family: when that family cannot describe the
	// oil, say which other families the user could pick.
	if why, bad := failed["co"]; bad && press.v > m.Pb {
		var others []string
		for _, id := range fit.Families(fit.Co) {
			if id != m.Families[fit.Co] {
				others = append(others, id)
			}
		}
		hint := fmt.Sprintf("; another --co family may apply (%s)", strings.Join(others, ", "))
		failed["co"] = why + hint
		if bw, ok := failed["Bo"]; ok {
			failed["Bo"] = fmt.Sprintf("above Pb it needs the %s compressibility: %s%s", m.Families[fit.Co], bw, hint)
		}
	}
	val := func(q string, v float64) *float64 {
		if _, bad := failed[q]; bad {
			return nil
		}
		return &v
	}
	out := oilCalcOut{PressurePsia: press.v, PbPsia: m.Pb, RsScfSTB: st.Rs, BoRbSTB: val("Bo", st.Bo), CoPerPsi: val("co", st.Co),
		OilDensity: val("oil density", st.OilDensity), DeadOilViscosity: m.MuDead, OilViscosity: val("oil viscosity", st.OilViscosity),
		Families: m.Families, Warnings: m.RangeWarnings(), NotEvaluated: failed}
	if out.Warnings == nil {
		out.Warnings = []string{}
	}
	if *asJSON {
		return writeJSON(stdout, stderr, out)
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	state := "saturated"
	if press.v > m.Pb {
		state = "undersaturated"
	}
	if !press.set {
		state = "at the bubble point"
	}
	fmt.Fprintf(tw, "oil at %.1f psia, %.1f degF (%s)\n", press.v, temp.v, state)
	rows := []struct {
		name, fam, q string
		v            float64
		unit         string
	}{
		{"bubble point Pb", m.Families[fit.Pb], "", m.Pb, "psia"},
		{"solution GOR Rs", m.Families[fit.Pb], "", st.Rs, "scf/STB"},
		{"oil FVF Bo", m.Families[fit.Bo], "Bo", st.Bo, "rb/STB"},
		{"compressibility co (at p)", coFamily(m, press.v), "co", st.Co, "1/psi"},
		{"oil density", "material balance", "oil density", st.OilDensity, "lbm/ft3"},
		{"dead-oil viscosity", m.Families[fit.MuDead], "", m.MuDead, "cP"},
		{"oil viscosity", viscFamily(m, press.v), "oil viscosity", st.OilViscosity, "cP"},
	}
	for _, r := range rows {
		if why, bad := failed[r.q]; bad {
			fmt.Fprintf(tw, "  %s\t-\t%s\t(%s) not evaluated: %s\n", r.name, r.unit, r.fam, why)
			continue
		}
		fmt.Fprintf(tw, "  %s\t%.5g\t%s\t(%s)\n", r.name, r.v, r.unit, r.fam)
	}
	tw.Flush()
	printWarnings(stdout, out.Warnings)
	return exitOK
}

func coFamily(m *fit.Model, p float64) string {
	if p > m.Pb {
		return m.Families[fit.Co]
	}
	return "mccain-rollins-villena"
}

func viscFamily(m *fit.Model, p float64) string {
	if p > m.Pb {
		return m.Families[fit.MuUnder]
	}
	return m.Families[fit.MuSat]
}

type gasCalcOut struct {
	PressurePsia float64  `json:"pressure_psia"`
	TemperatureF float64  `json:"temperature_degf"`
	Ppc          float64  `json:"ppc_psia"`
	Tpc          float64  `json:"tpc_degr"`
	Ppr          float64  `json:"ppr"`
	Tpr          float64  `json:"tpr"`
	Z            float64  `json:"z"`
	Bg           float64  `json:"bg_rcf_scf"`
	BgRbMscf     float64  `json:"bg_rb_mscf"`
	Expansion    float64  `json:"expansion_scf_rcf"`
	Density      float64  `json:"gas_density_lbm_ft3"`
	Viscosity    float64  `json:"gas_viscosity_cp"`
	PpcFamily    string   `json:"ppc_family"`
	ZFamily      string   `json:"z_family"`
	Warnings     []string `json:"warnings"`
}

func runCalcGas(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("calc gas", "labmatch calc gas --gas-gravity G --temperature T --pressure P [--h2s X --co2 X --n2 X] [--ppc ID] [--z ID] [--json]",
		"Natural-gas properties at one pressure and temperature from the gas gravity.\nValues take units: 2000psia, 150bar, 93degC; plain numbers are field units.")
	gg := fs.Float64("gas-gravity", 0, "gas `gravity` (air = 1)")
	temp := quantity(fs, "temperature", lab.Temperature, 0, "`temperature` (default unit degF)")
	press := quantity(fs, "pressure", lab.Pressure, 0, "`pressure` (default unit psia)")
	h2s := fs.Float64("h2s", 0, "H2S in the gas, mole `percent`")
	co2 := fs.Float64("co2", 0, "CO2 in the gas, mole `percent`")
	n2 := fs.Float64("n2", 0, "N2 in the gas, mole `percent` (no correction is made; a warning is given above 5 %)")
	ppcID := fs.String("ppc", "sutton", "pseudo-critical `family`: "+ids(correlations.PseudoCritical))
	zID := fs.String("z", "dak", "Z-factor `family`: "+ids(correlations.GasZ))
	asJSON := fs.Bool("json", false, "print JSON")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) > 0 {
		return usageError(fs, stderr, "unexpected argument %q", pos[0])
	}
	if !(*gg > 0) || !temp.set || !press.set {
		return usageError(fs, stderr, "--gas-gravity, --temperature and --pressure are required")
	}
	for name, v := range map[string]float64{"--h2s": *h2s, "--co2": *co2, "--n2": *n2} {
		if !(v >= 0 && v <= 100) {
			return usageError(fs, stderr, "%s %g: want mole percent between 0 and 100", name, v)
		}
	}
	if *h2s+*co2+*n2 > 100 {
		return usageError(fs, stderr, "--h2s, --co2 and --n2 add up to %g %%, more than 100", *h2s+*co2+*n2)
	}
	if err := knownID(correlations.PseudoCritical, *ppcID); err != nil {
		return usageError(fs, stderr, "--ppc: %v", err)
	}
	if err := knownID(correlations.GasZ, *zID); err != nil {
		return usageError(fs, stderr, "--z: %v", err)
	}
	res, err := correlations.EvaluateGas(correlations.GasInput{
		GasGravity: *gg, Temperature: temp.v, Pressure: press.v,
		H2S: *h2s / 100, CO2: *co2 / 100, N2: *n2 / 100, PseudoCritical: *ppcID, Z: *zID,
	})
	if err != nil {
		fmt.Fprintln(stderr, "labmatch:", err)
		return exitData
	}
	out := gasCalcOut{PressurePsia: press.v, TemperatureF: temp.v, Ppc: res.Ppc, Tpc: res.Tpc, Ppr: res.Ppr, Tpr: res.Tpr,
		Z: res.Z, Bg: res.Bg, BgRbMscf: res.Bg * 1000 / 5.614583, Expansion: 1 / res.Bg, Density: res.Density,
		Viscosity: res.Viscosity, PpcFamily: *ppcID, ZFamily: *zID, Warnings: res.Warnings}
	if out.Warnings == nil {
		out.Warnings = []string{}
	}
	if *asJSON {
		return writeJSON(stdout, stderr, out)
	}
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintf(tw, "gas of gravity %.3f at %.1f psia, %.1f degF\n", *gg, press.v, temp.v)
	for _, r := range []struct {
		name string
		v    float64
		unit string
	}{
		{"pseudo-critical pressure", out.Ppc, "psia"}, {"pseudo-critical temperature", out.Tpc, "degR"},
		{"pseudo-reduced pressure", out.Ppr, ""}, {"pseudo-reduced temperature", out.Tpr, ""},
		{"Z-factor", out.Z, ""}, {"gas FVF Bg", out.Bg, "rcf/scf"}, {"gas FVF Bg", out.BgRbMscf, "rb/Mscf"},
		{"expansion factor E", out.Expansion, "scf/rcf"}, {"gas density", out.Density, "lbm/ft3"},
		{"gas viscosity", out.Viscosity, "cP"},
	} {
		fmt.Fprintf(tw, "  %s\t%.5g\t%s\n", r.name, r.v, r.unit)
	}
	tw.Flush()
	printWarnings(stdout, out.Warnings)
	return exitOK
}

func ids(p correlations.Property) string { return joinIDs(correlations.IDs(p)) }

func knownID(p correlations.Property, id string) error {
	for _, k := range correlations.IDs(p) {
		if k == id {
			return nil
		}
	}
	return fmt.Errorf("unknown family %q (known: %s)", id, ids(p))
}

// gravityUsers lists the families (with their property) that take a kind of gas gravity, from
// the catalog.
func gravityUsers(k correlations.GravityKind) string {
	var s []string
	for _, e := range correlations.Catalog() {
		if e.Gravity == k {
			s = append(s, fmt.Sprintf("%s %s", e.Property, e.ID))
		}
	}
	return strings.Join(s, ", ")
}

func printWarnings(w io.Writer, ws []string) {
	for _, s := range ws {
		fmt.Fprintln(w, "warning:", s)
	}
}

func writeJSON(stdout, stderr io.Writer, v any) int {
	enc := json.NewEncoder(stdout)
	enc.SetIndent("", "  ")
	enc.SetEscapeHTML(false)
	if err := enc.Encode(v); err != nil {
		fmt.Fprintln(stderr, "labmatch:", err)
		return exitData
	}
	return exitOK
}

// familySet holds one --<property> flag per tuned property.
type familySet map[fit.PropertyID]*string

// familyFlags adds one family flag per property; defaults names each property's default
// family, or nil when the default is the best-ranked family.
func familyFlags(fs *flag.FlagSet, defaults fit.Choice, props ...fit.PropertyID) familySet {
	set := familySet{}
	for _, p := range props {
		def := "best-ranked"
		if defaults != nil {
			def = defaults[p]
		}
		set[p] = fs.String(flagName(p), "", fmt.Sprintf("%s `family`: %s (default: %s)", p, joinIDs(fit.Families(p)), def))
	}
	return set
}

func flagName(p fit.PropertyID) string {
	switch p {
	case fit.MuDead:
		return "mu-dead"
	case fit.MuSat:
		return "mu-sat"
	case fit.MuUnder:
		return "mu-under"
	}
	return string(p)
}

func joinIDs(ids []string) string {
	s := ""
	for i, id := range ids {
		if i > 0 {
			s += ", "
		}
		s += id
	}
	return s
}

// choice returns the families set by flag, refusing unknown ids.
func (s familySet) choice() (fit.Choice, error) {
	c := fit.Choice{}
	for p, v := range s {
		if *v == "" {
			continue
		}
		known := false
		for _, id := range fit.Families(p) {
			known = known || id == *v
		}
		if !known {
			return nil, fmt.Errorf("--%s %q: unknown family (known: %s)", flagName(p), *v, joinIDs(fit.Families(p)))
		}
		c[p] = *v
	}
	return c, nil
}

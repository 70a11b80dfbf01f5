package fit

import (
	"strings"

	"labmatch/correlations"
)

// PropertyID names a tuned property. The ids appear in files, flags and JSON.
type PropertyID string

// The tuned properties, in the order they are tuned and shown.
const (
	Pb      PropertyID = "pb"       // solution-gas pair: Pb(Rsb) and Rs(p) below Pb
	Bo      PropertyID = "bo"       // saturated oil FVF at and below Pb
	Co      PropertyID = "co"       // undersaturated oil compressibility (CCE above Pb)
	MuDead  PropertyID = "mu_dead"  // dead-oil viscosity at reservoir temperature
	MuSat   PropertyID = "mu_sat"   // live-oil viscosity at and below Pb
	MuUnder PropertyID = "mu_under" // oil viscosity above Pb
	Z       PropertyID = "z"        // Z-factor of the DL gas
)

// Properties lists every tuned property in order.
var Properties = []PropertyID{Pb, Bo, Co, MuDead, MuSat, MuUnder, Z}

// catalogProperty maps a tuned property to the catalog property of its families.
func catalogProperty(p PropertyID) correlations.Property {
	switch p {
	case Pb:
		return correlations.SolutionGas
	case Bo:
		return correlations.OilFVF
	case Co:
		return correlations.Compressibility
	case MuDead:
		return correlations.DeadViscosity
	case MuSat:
		return correlations.SatViscosity
	case MuUnder:
		return correlations.UnderViscosity
	case Z:
		return correlations.GasZ
	}
	return ""
}

// Families returns the ids of the families that can describe a property. A z family is a
// pseudo-critical method and a Z method, "sutton+dak", so that the DL's own Z values choose
// both.
func Families(p PropertyID) []string {
	if p != Z {
		return correlations.IDs(catalogProperty(p))
	}
	var ids []string
	for _, pc := range correlations.IDs(correlations.PseudoCritical) {
		for _, z := range correlations.IDs(correlations.GasZ) {
			ids = append(ids, pc+"+"+z)
		}
	}
	return ids
}

// familiesFor returns the families that rank and TuneAll consider under the options: a forced
// pseudo-critical method keeps only its z families.
func familiesFor(p PropertyID, o Options) []string {
	fams := Families(p)
	if p != Z || o.PseudoCritical == "" {
		return fams
	}
	var out []string
	for _, f := range fams {
		if strings.HasPrefix(f, o.PseudoCritical+"+") {
			out = append(out, f)
		}
	}
	return out
}

// splitZFamily returns the pseudo-critical and Z methods of a z family; a plain Z method id
// (version 1 tuning files) takes the pseudo-critical method of the options (default Sutton).
func splitZFamily(family string, o Options) (pc, z string) {
	if pc, z, ok := strings.Cut(family, "+"); ok {
		return pc, z
	}
	return o.pseudoCritical(), family
}

// CatalogEntry returns the catalog entry of a property's family (for z, of its Z method:
// "sutton+dak" → dak), the entry the range checks use.
func CatalogEntry(p PropertyID, family string) (correlations.Entry, error) {
	return catalogEntry(p, family)
}

func catalogEntry(p PropertyID, family string) (correlations.Entry, error) {
	if p == Z {
		_, family = splitZFamily(family, Options{})
	}
	return correlations.Lookup(catalogProperty(p), family)
}

// Loss selects how residuals are weighed in the objective.
type Loss string

// Losses.
const (
	Relative Loss = "relative" // squared relative errors (default)
	Absolute Loss = "absolute" // squared absolute errors in the property's unit
	Huber    Loss = "huber"    // Huber loss on relative errors: quadratic within HuberDelta, linear beyond
)

// Options control tuning. The zero value means: the depth chosen by leave-one-out error,
// relative errors, every point weighted 1, Sutton pseudo-criticals for Z.
type Options struct {
	// Depth forces a rung of the ladder; "" = the rung with the smallest leave-one-out error
	// (a deeper rung only when it wins clearly, see chooseRung).
	Depth Depth
	// PropertyDepth forces the depth of single properties, over Depth ("" in it: chosen by
	// leave-one-out), so that a chain of properties (the live-oil viscosities on the tuned
	// dead-oil one) keeps each property's own depth.
	PropertyDepth map[PropertyID]Depth
	Loss          Loss    // "" = Relative
	HuberDelta    float64 // relative error where the Huber loss turns linear; 0 = 0.02
	// Ridge is the strength λ of the refit depth's pull towards the published coefficients;
	// 0 = RidgeStrength.
	Ridge float64
	// Excluded lists, per property, the indexes (into Problem.Points) of points left out.
	Excluded map[PropertyID][]int
	// Weights gives, per property, a weight per point (same length as the points); nil = 1.
	Weights map[PropertyID][]float64
	// PseudoCritical forces the pseudo-critical method of the z families ("sutton" or
	// "standing"); "" ranks both. A plain Z method id (without "ppc+") takes it, default Sutton.
	PseudoCritical string
}

func (o Options) loss() Loss {
	if o.Loss == "" {
		return Relative
	}
	return o.Loss
}

func (o Options) huberDelta() float64 {
	if o.HuberDelta <= 0 {
		return 0.02
	}
	return o.HuberDelta
}

// depthFor is the depth forced for property p, "" for the leave-one-out choice.
func (o Options) depthFor(p PropertyID) Depth {
	if d, ok := o.PropertyDepth[p]; ok {
		return d
	}
	return o.Depth
}

func (o Options) ridge() float64 {
	if o.Ridge <= 0 {
		return RidgeStrength
	}
	return o.Ridge
}

func (o Options) pseudoCritical() string {
	if o.PseudoCritical == "" {
		return "sutton"
	}
	return o.PseudoCritical
}

// Depth is a rung of the tuning ladder (DESIGN.md §5). Each rung's parameters are a superset
// of the rung below.
type Depth string

// The rungs, shallowest first.
const (
	DepthPublished  Depth = "published"  // the published correlation, no parameter
	DepthMultiplier Depth = "multiplier" // pb: the anchor on the report's Pb alone; others: one multiplier
	DepthShape      Depth = "shape"      // pb: a bend of Rs(p) below Pb; others: multiplier and shift (skipped for mu_under, z)
	DepthRefit      Depth = "refit"      // the family's declared coefficients, regularised towards the published values
)

// Depths lists the rungs of the ladder, shallowest first.
var Depths = []Depth{DepthPublished, DepthMultiplier, DepthShape, DepthRefit}

// Rung is one depth of a property's ladder: its parameters and its training and
// leave-one-out errors.
type Rung struct {
	Depth   Depth    `json:"depth"`
	Free    int      `json:"free_parameters"`
	Params  Params   `json:"parameters"`
	Tuned   Stats    `json:"tuned"`                     // training statistics at the rung's optimum
	LOO     *float64 `json:"aare_pct_loo"`              // leave-one-out AARE, %; nil when not available
	LOOMax  *float64 `json:"max_are_pct_loo,omitempty"` // largest leave-one-out |RE|, %
	LOONote string   `json:"loo_note,omitempty"`        // why there is no leave-one-out error
	Skipped string   `json:"skipped,omitempty"`         // why the rung was not fitted
	Chosen  bool     `json:"chosen"`
	Flags   []string `json:"flags,omitempty"`
}

// Params are the tuning parameters of one property. Multiplier 1, Shift 0, no Bend and no
// Coefficients reproduce the published correlation.
//
// For pb the Multiplier is the pressure scale of the pair, Pb_tuned(R) = m·Pb(R') + s and
// Rs_tuned(p) = Rsb·[Rs((p − s)/m)/Rsb]^e with R' = Rsb·(R/Rsb)^(1/e): at every tuned depth the
// scale is fixed by the report's bubble point (the anchor), and e bends Rs(p) below Pb. For the
// other properties the tuned value is a + m·b + s with a and b from the correlation (see the
// models in models.go).
type Params struct {
	Multiplier float64 `json:"multiplier"`
	Shift      float64 `json:"shift"`
	// Bend is the exponent e that bends the pb pair (shape depth); 0 means none (1).
	Bend float64 `json:"bend,omitempty"`
	// Coefficients are the family's declared coefficients, in catalog order (refit depth);
	// nil means the published values.
	Coefficients []float64 `json:"coefficients,omitempty"`
}

// exponent returns the pb bend, 1 when none is set.
func (q Params) bend() float64 {
	if q.Bend == 0 {
		return 1
	}
	return q.Bend
}

// clone returns a copy that does not share the coefficient slice.
func (q Params) clone() Params {
	if q.Coefficients != nil {
		q.Coefficients = append([]float64(nil), q.Coefficients...)
	}
	return q
}

// Published are the parameters that reproduce the published correlation.
var Published = Params{Multiplier: 1}

// Stats are error statistics over the points used.
type Stats struct {
	Points   int     `json:"points"`
	AARE     float64 `json:"aare_pct"`    // average absolute relative error, %
	Bias     float64 `json:"bias_pct"`    // average relative error (ARE), %
	MaxARE   float64 `json:"max_are_pct"` // largest absolute relative error, %
	RMSE     float64 `json:"rmse"`        // root-mean-square error, in RMSEUnit
	RMSEUnit string  `json:"rmse_unit"`   // unit of RMSE (for pb: the Rs points, scf/STB)
}

// Point is one lab value that a property is fitted to, with the context the correlation needs.
type Point struct {
	Quantity   string  // "Pb", "Rs", "Bo", "co", "mu_dead", "mu", "Z"
	Unit       string  // unit of Lab
	Pressure   float64 // psia
	Lab        float64 // measured (separator-basis) value
	Rs         float64 // solution GOR at this point, scf/STB (Pb: Rsb; Bo, mu: lab Rs)
	GasGravity float64 // gas gravity for Z points
	Source     string  // file the value comes from
	Line       int     // line in Source
}

// Resolved returns the options with every default filled in, as the tuner uses them.
func (o Options) Resolved() Options {
	o.Loss, o.HuberDelta, o.Ridge = o.loss(), o.huberDelta(), o.ridge()
	return o
}

// DeclaredCoefficients returns the refit coefficients that a family of a property declares in
// the catalog (nil: none).
func DeclaredCoefficients(p PropertyID, family string) []correlations.Coefficient {
	switch p {
	case Pb:
		if f, err := correlations.SolutionGasByID(family); err == nil {
			return f.Coefficients
		}
	case Bo:
		if f, err := correlations.OilFVFByID(family); err == nil {
			return f.Coefficients
		}
	case MuDead:
		if f, err := correlations.DeadViscosityByID(family); err == nil {
			return f.Coefficients
		}
	case MuSat:
		if f, err := correlations.SatViscosityByID(family); err == nil {
			return f.Coefficients
		}
	}
	return nil
}

package lab

import (
	"fmt"
	"math"
	"strings"
)

// FluidType is a reservoir-fluid class of McCain's five (only the three that a laboratory
// oil report can describe are told apart here).
type FluidType int

// Fluid types.
const (
	UnknownFluid  FluidType = iota // inputs missing or not usable
	BlackOil                       // black-oil correlations apply
	VolatileOil                    // black-oil correlations are a poor choice
	GasCondensate                  // retrograde gas: black-oil correlations do not apply
)

func (t FluidType) String() string {
	switch t {
	case BlackOil:
		return "black oil"
	case VolatileOil:
		return "volatile oil"
	case GasCondensate:
		return "gas condensate"
	}
	return "unknown"
}

// MarshalText writes the fluid type as its name in JSON.
func (t FluidType) MarshalText() ([]byte, error) { return []byte(t.String()), nil }

// McCain's field rules of thumb for the fluid type (McCain, The Properties of Petroleum
// Fluids, 2nd ed., 1990, ch. 5, and "Heavy Components Control Reservoir Fluid Behavior",
// JPT, Sept. 1994, pp. 746–750, table of field indicators): black oil: initial producing GOR
// below 1,750 scf/STB, stock-tank gravity below 45 °API, Bo below 2.0 rb/STB; volatile oil:
// 1,750–3,200 scf/STB, 40 °API or higher, Bo above 2.0; retrograde gas (gas condensate):
// above 3,200 scf/STB. The initial producing GOR is the primary indicator; gravity and Bo
// confirm it.
const (
	BlackOilMaxGOR    = 1750.0 // scf/STB
	VolatileOilMaxGOR = 3200.0 // scf/STB
	BlackOilMaxAPI    = 45.0   // °API
	VolatileOilMinAPI = 40.0   // °API
	BlackOilMaxBo     = 2.0    // rb/STB
)

// Classify names the fluid type from the solution GOR at the bubble point rsb (scf/STB,
// separator basis: it stands for the initial producing GOR), the stock-tank gravity api
// (°API) and the oil FVF at the bubble point bob (rb/STB), by McCain's rules of thumb (see
// BlackOilMaxGOR). The GOR decides; api and bob, when positive, are checked against the
// class and any disagreement is described in the returned reason. api or bob of 0 means
// not known.
func Classify(rsb, api, bob float64) (FluidType, string) {
	if !(rsb >= 0) || math.IsInf(rsb, 0) {
		return UnknownFluid, fmt.Sprintf("no usable Rsb (%g scf/STB)", rsb)
	}
	var t FluidType
	var why []string
	switch {
	case rsb < BlackOilMaxGOR:
		t = BlackOil
		why = append(why, fmt.Sprintf("Rsb %.0f scf/STB < %.0f", rsb, BlackOilMaxGOR))
	case rsb <= VolatileOilMaxGOR:
		t = VolatileOil
		why = append(why, fmt.Sprintf("Rsb %.0f scf/STB in %.0f–%.0f", rsb, BlackOilMaxGOR, VolatileOilMaxGOR))
	default:
		t = GasCondensate
		why = append(why, fmt.Sprintf("Rsb %.0f scf/STB > %.0f", rsb, VolatileOilMaxGOR))
	}
	var odd []string
	if api > 0 && !math.IsInf(api, 0) {
		s := fmt.Sprintf("%.1f °API", api)
		switch {
		case t == BlackOil && api >= BlackOilMaxAPI:
			odd = append(odd, s+" is volatile-oil-like (black oils are below 45)")
		case t == VolatileOil && api < VolatileOilMinAPI:
			odd = append(odd, s+" is black-oil-like (volatile oils are 40 or higher)")
		default:
			why = append(why, s)
		}
	}
	if bob > 0 && !math.IsInf(bob, 0) {
		s := fmt.Sprintf("Bob %.3f rb/STB", bob)
		switch {
		case t == BlackOil && bob >= BlackOilMaxBo:
			odd = append(odd, s+" is volatile-oil-like (black oils are below 2.0)")
		case t == VolatileOil && bob <= BlackOilMaxBo:
			odd = append(odd, s+" is black-oil-like (volatile oils are above 2.0)")
		default:
			why = append(why, s)
		}
	}
	reason := t.String() + ": " + strings.Join(why, ", ")
	if len(odd) > 0 {
		reason += "; but " + strings.Join(odd, ", ") + ": near the boundary, GOR decides"
	}
	return t, reason + " (McCain's rules of thumb)"
}

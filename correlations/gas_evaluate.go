package correlations

import "fmt"

// GasInput describes one evaluation of the gas chain.
type GasInput struct {
	GasGravity     float64 // air = 1
	Temperature    float64 // °F
	Pressure       float64 // psia
	H2S, CO2, N2   float64 // mole fractions
	PseudoCritical string  // pseudo-critical family id ("sutton", "standing")
	Z              string  // Z family id ("dak", "hall-yarborough")
}

// GasResult is every gas property at one state, with warnings about the inputs.
type GasResult struct {
	Ppc, Tpc  float64 // psia, °R (after the sour correction)
	Ppr, Tpr  float64
	Z         float64
	Bg        float64 // rcf/scf at 14.696 psia and 60 °F
	Density   float64 // lbm/ft³
	Viscosity float64 // cP (Lee, Gonzalez and Eakin)
	Warnings  []string
}

// EvaluateGas runs the gas chain: pseudo-criticals from gravity, the Wichert–Aziz correction,
// Z, Bg, density and viscosity, and collects range warnings of every method used.
func EvaluateGas(in GasInput) (GasResult, error) {
	var res GasResult
	pcf, err := PseudoCriticalByID(in.PseudoCritical)
	if err != nil {
		return res, err
	}
	if res.Ppc, res.Tpc, err = pcf.Critical(in.GasGravity); err != nil {
		return res, err
	}
	if res.Ppc, res.Tpc, err = WichertAziz(res.Ppc, res.Tpc, in.H2S, in.CO2); err != nil {
		return res, err
	}
	if res.Z, res.Tpr, res.Ppr, err = GasZFromGravity(in.Pressure, in.Temperature, in.GasGravity, in.H2S, in.CO2, in.PseudoCritical, in.Z); err != nil {
		return res, err
	}
	if res.Bg, err = GasFVF(res.Z, in.Pressure, in.Temperature); err != nil {
		return res, err
	}
	if res.Density, err = GasDensity(in.Pressure, in.Temperature, res.Z, in.GasGravity); err != nil {
		return res, err
	}
	if res.Viscosity, err = LeeGonzalezEakin(in.Temperature, in.Pressure, res.Z, in.GasGravity); err != nil {
		return res, err
	}
	values := map[string]float64{"gas gravity": in.GasGravity, "temperature": in.Temperature, "p": in.Pressure,
		"Tpr": res.Tpr, "Ppr": res.Ppr}
	for _, e := range []struct {
		p  Property
		id string
	}{{PseudoCritical, in.PseudoCritical}, {GasZ, in.Z}, {GasViscosity, "lee-gonzalez-eakin"}} {
		if ent, err := Lookup(e.p, e.id); err == nil {
			res.Warnings = append(res.Warnings, ent.Check(values)...)
		}
	}
	if w := RichGasWarning(in.GasGravity, res.Tpr); w != "" {
		res.Warnings = append(res.Warnings, w)
	}
	if in.N2 > 0.05 {
		res.Warnings = append(res.Warnings, fmt.Sprintf("N2 %.1f mol%%: no nitrogen correction is made; gravity-only Z may be off", 100*in.N2))
	}
	return res, nil
}

package correlations

import "math"

// McCain density method for saturated oil: the density of the reservoir liquid from a material
// balance on a stock-tank barrel plus its dissolved gas (Standing and Katz's method in the form
// given by McCain, The Properties of Petroleum Fluids, 2nd ed., 1990, ch. 11), with the apparent
// liquid density of the dissolved gas from the iteration of W.D. McCain Jr. and N.C. Hill,
// "Correlations for Liquid Densities and Evolved Gas Specific Gravities for Black Oils During
// Pressure Depletion", SPE 30773 (1995). Steps:
//
//  1. pseudo-liquid density at 60 °F and 14.7 psia, iterated from ρpo = 52.8 − 0.01·Rs:
//     ρa  = −49.8930 + 85.0149·γg − 3.70373·γg·ρpo + 0.0479818·γg·ρpo² + 2.98914·ρpo − 0.0356888·ρpo²
//     ρpo = (Rs·γg + 4,600·γo) / (73.71 + Rs·γg/ρa)
//  2. pressure correction: Δρp = (0.167 + 16.181·10^(−0.0425·ρpo))·(p/1000)
//     − 0.01·(0.299 + 263·10^(−0.0603·ρpo))·(p/1000)²,  ρbs = ρpo + Δρp
//  3. temperature correction: ΔρT = (0.00302 + 1.505·ρbs^−0.951)·(T − 60)^0.938
//     − (0.0216 − 0.0233·10^(−0.0161·ρbs))·(T − 60)^0.475,  ρo = ρbs − ΔρT
//
// densities lbm/ft³, p psia, T °F (≥ 60), γg the separator gas gravity (the 1995 paper's
// iteration is written for the separator gas). McCain and Hill report an average error of
// about 1–2 % for the density.

const (
	mhMaxIter = 100
	mhRelTol  = 1e-12
)

// McCainSaturatedOilDensity returns the density (lbm/ft³) of saturated oil holding rs scf/STB
// at p psia and o.Temperature by the McCain density method above.
func McCainSaturatedOilDensity(p, rs float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkPressure("p", p); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	g, gammaO := o.GasGravity, o.OilGravity()
	rho := math.Max(52.8-0.01*rs, 20)
	if rs == 0 {
		rho = 4600 * gammaO / 73.71
	} else {
		converged := false
		for range mhMaxIter {
			rhoA := -49.8930 + 85.0149*g - 3.70373*g*rho + 0.0479818*g*rho*rho + 2.98914*rho - 0.0356888*rho*rho
			if !(rhoA > 0) {
				return 0, ErrNoConvergence
			}
			next := (rs*g + 4600*gammaO) / (73.71 + rs*g/rhoA)
			if math.Abs(next-rho) <= mhRelTol*next {
				rho = next
				converged = true
				break
			}
			rho = next
		}
		if !converged {
			return 0, ErrNoConvergence
		}
	}
	pk := p / 1000
	rhoBS := rho + (0.167+16.181*pow10(-0.0425*rho))*pk -
		0.01*(0.299+263*pow10(-0.0603*rho))*pk*pk
	// The temperature correction is fitted above 60 °F; below it (a few real reservoirs are
	// colder) it is continued as an odd function of T − 60, so the oil grows denser as it
	// cools and the density stays continuous at 60 °F.
	dt := o.Temperature - 60
	adt, sign := math.Abs(dt), 1.0
	if dt < 0 {
		sign = -1
	}
	dRhoT := 0.0
	if adt > 0 {
		dRhoT = sign * ((0.00302+1.505*pow(rhoBS, -0.951))*pow(adt, 0.938) -
			(0.0216-0.0233*pow10(-0.0161*rhoBS))*pow(adt, 0.475))
	}
	rhoO := rhoBS - dRhoT
	if !(rhoO > 0) {
		return 0, ErrNotFinite
	}
	return finite(rhoO)
}

// McCainOilFVF returns the saturated oil formation volume factor (rb/STB) from the McCain
// density (McCainSaturatedOilDensity) by the material balance of McCain (1990):
//
//	Bo = (62.37·γo + 0.01357·Rs·γg) / ρo,
//
// 62.37 lbm/ft³ being water at 60 °F and 0.01357 = 0.0763/5.615 the mass of a standard cubic
// foot of air per cubic foot of barrel. Unlike the other Bo families it uses p.
func McCainOilFVF(p, rs float64, o Oil) (float64, error) {
	rho, err := McCainSaturatedOilDensity(p, rs, o)
	if err != nil {
		return 0, err
	}
	return finite((62.37*o.OilGravity() + 0.01357*rs*o.GasGravity) / rho)
}

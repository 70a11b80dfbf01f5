package correlations

// OilDensity returns the density (lbm/ft³) of oil holding rs scf/STB whose formation volume
// factor is bo rb/STB, by material balance on one stock-tank barrel:
//
//	ρo = (62.4·γo + 0.0136·Rs·γg) / Bo,
//
// 62.4 lbm/ft³ being water at 60 °F and 0.0136 ≈ 0.0764/5.615 the mass (lbm) of one standard
// cubic foot of gas of unit gravity per cubic foot of stock-tank barrel (common practice;
// McCain's method uses 62.37 and 0.01357, see McCainOilFVF).
func OilDensity(rs, bo float64, o Oil) (float64, error) {
	if err := checkOil(o); err != nil {
		return 0, err
	}
	if err := checkGOR("Rs", rs); err != nil {
		return 0, err
	}
	if !(bo > 0) || !isFinite(bo) {
		return 0, inputError("Bo", bo, "a finite value > 0 rb/STB")
	}
	return finite((62.4*o.OilGravity() + 0.0136*rs*o.GasGravity) / bo)
}

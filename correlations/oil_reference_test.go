package correlations

import (
	"testing"
)

// Tolerances, named after the precision of their sources.
const (
	tolFromMemory    = 0.02  // values recalled, not re-checked in the source: ±2 %
	tolSecondary     = 0.02  // values from a secondary copy of a worked example: ±2 %
	tolPrinted4      = 2e-4  // a result printed to four or five significant figures
	tolPbBand        = 0.25  // every Pb correlation against a measured Pb
	tolBoBand        = 0.06  // every Bo correlation against a measured Bob
	tolCoBand        = 0.35  // compressibility correlations against a measured co
	tolDensityMemory = 0.025 // material-balance density against the tabulated ρob (from memory)
)

// TestWorkedExamples checks single published calculations.
func TestWorkedExamples(t *testing.T) {
	const sm3PerSTB = 5.614583 // scf/STB per sm³/sm³ (1 bbl = 5.614583 ft³, check-values.md)
	tests := []struct {
		name string
		fn   func() (float64, error)
		want float64
		tol  float64
	}{
		// check-values.md example 4: Ahmed, Reservoir Engineering Handbook, ch. 2, Standing
		// example: Rsb 751, γg 0.851, 47.1 °API, 250 °F → Pb = 2,181 psia (from memory).
		{"standing Pb, Ahmed ch. 2", func() (float64, error) {
			return StandingBubblePoint(751, Oil{API: 47.1, GasGravity: 0.851, Temperature: 250})
		}, 2181, tolFromMemory},
		// check-values.md example 2: Wolcott (2009), Applied Waterflood Field Development
		// (secondary copy): Valkó–McCain Pb = 11.65 MPa = 1,688 psia for Rsb 60 sm³/sm³,
		// 35 °API, γg 0.75, 90 °C (194 °F).
		{"valko-mccain Pb, Wolcott", func() (float64, error) {
			return ValkoMcCainBubblePoint(60*sm3PerSTB, Oil{API: 35, GasGravity: 0.75, Temperature: 194})
		}, 11.65e6 / 6894.757, tolSecondary},
		// Guo, Lyons and Ghalambor (2007), Petroleum Production Engineering, p. 2/20, Standing's
		// Bo with Rs 600 scf/STB, γg 0.8, γo 0.85, 180 °F: 1.34529 rb/STB, as reproduced by the
		// petrocalchub.com equation page (secondary copy of a printed result).
		{"standing Bo, Guo et al.", func() (float64, error) {
			return StandingOilFVF(0, 600, Oil{API: 141.5/0.85 - 131.5, GasGravity: 0.8, Temperature: 180})
		}, 1.34529, tolPrinted4},
		// Ahmed, Reservoir Engineering Handbook, ch. 2, Standing Bo for oil 1 of the six-oil
		// table: 1.506 rb/STB (from memory).
		{"standing Bo, Ahmed oil 1", func() (float64, error) {
			return StandingOilFVF(2377, 751, Oil{API: 47.1, GasGravity: 0.851, Temperature: 250})
		}, 1.506, tolFromMemory},
	}
	for _, tc := range tests {
		got, err := tc.fn()
		if err != nil {
			t.Errorf("%s: %v", tc.name, err)
			continue
		}
		if relErr(got, tc.want) > tc.tol {
			t.Errorf("%s = %.6g, want %.6g ±%.2g%%", tc.name, got, tc.want, 100*tc.tol)
		}
	}
}

// sixOils is the table of six oils with measured properties from Ahmed, Reservoir Engineering
// Handbook, ch. 2 (from memory, check-values.md; oil 2 corroborated by an independent
// differential liberation of the same fluid). Separator pressures there are psig.
var sixOils = []struct {
	t, pb, rsb, bob, rhob, co, pco, psepGauge, tsep, api, gg float64
}{
	{250, 2377, 751, 1.528, 38.13, 22.14e-6, 2689, 150, 60, 47.1, 0.851}, // oil 1
	{220, 2620, 768, 1.474, 40.95, 18.75e-6, 2810, 100, 75, 40.7, 0.855}, // oil 2
	{260, 2051, 693, 1.529, 37.37, 22.69e-6, 2526, 100, 72, 48.6, 0.911}, // oil 3
	{237, 2884, 968, 1.619, 38.92, 21.51e-6, 2942, 60, 120, 40.5, 0.898}, // oil 4
	{218, 3065, 943, 1.570, 37.70, 24.16e-6, 3273, 200, 60, 44.2, 0.781}, // oil 5
	{180, 4239, 807, 1.385, 46.79, 11.45e-6, 4370, 85, 173, 27.3, 0.848}, // oil 6
}

func sixOil(i int) Oil {
	s := sixOils[i]
	return Oil{API: s.api, GasGravity: s.gg, Temperature: s.t, SepPressure: s.psepGauge + 14.7, SepTemperature: s.tsep}
}

// TestSixOilsBubblePoint compares every solution-gas family with the measured bubble points:
// correlations scatter, so the band is wide, but a wrong coefficient or unit falls outside it.
func TestSixOilsBubblePoint(t *testing.T) {
	for _, f := range SolutionGasFamilies() {
		for i, s := range sixOils {
			pb, err := f.BubblePoint(s.rsb, sixOil(i))
			if err != nil {
				t.Errorf("%s oil %d: %v", f.ID, i+1, err)
				continue
			}
			if relErr(pb, s.pb) > tolPbBand {
				t.Errorf("%s oil %d: Pb = %.0f psia, measured %.0f", f.ID, i+1, pb, s.pb)
			}
		}
	}
}

// TestSixOilsFVF compares every Bo family with the measured Bob at the measured Rsb and Pb.
// The 6 % band holds Standing on oil 6 (+5.5 %, a 27 °API oil far from its California data).
func TestSixOilsFVF(t *testing.T) {
	for _, f := range OilFVFFamilies() {
		for i, s := range sixOils {
			bo, err := f.FVF(s.pb, s.rsb, sixOil(i))
			if err != nil {
				t.Errorf("%s oil %d: %v", f.ID, i+1, err)
				continue
			}
			if relErr(bo, s.bob) > tolBoBand {
				t.Errorf("%s oil %d: Bob = %.4f, measured %.3f", f.ID, i+1, bo, s.bob)
			}
		}
	}
}

// TestSixOilsCompressibility compares the undersaturated families with the measured co.
func TestSixOilsCompressibility(t *testing.T) {
	for _, id := range []string{"vasquez-beggs", "petrosky-farshad", "spivey-valko-mccain"} {
		f, err := CompressibilityByID(id)
		if err != nil {
			t.Fatal(err)
		}
		for i, s := range sixOils {
			co, err := f.Co(s.pco, s.pb, s.rsb, sixOil(i))
			if err != nil {
				t.Errorf("%s oil %d: %v", id, i+1, err)
				continue
			}
			if relErr(co, s.co) > tolCoBand {
				t.Errorf("%s oil %d: co = %.3g 1/psi at %.0f psia, measured %.3g", id, i+1, co, s.pco, s.co)
			}
		}
	}
}

// TestSixOilsDensity checks the material-balance density against the tabulated density at the
// bubble point, using the measured Rsb and Bob.
func TestSixOilsDensity(t *testing.T) {
	for i, s := range sixOils {
		rho, err := OilDensity(s.rsb, s.bob, sixOil(i))
		if err != nil {
			t.Fatalf("oil %d: %v", i+1, err)
		}
		if relErr(rho, s.rhob) > tolDensityMemory {
			t.Errorf("oil %d: ρob = %.2f lbm/ft³, tabulated %.2f", i+1, rho, s.rhob)
		}
	}
}

// TestVasquezBeggsGasGravity recomputes the separator normalisation by hand for oil 1
// (150 psig, 60 °F, 47.1 °API, γg 0.851): 0.851·[1 + 5.912e−5·47.1·60·log10(164.7/114.7)]
// = 0.87334 (arithmetic of the published form).
func TestVasquezBeggsGasGravity(t *testing.T) {
	g, err := VasquezBeggsGasGravity(sixOil(0))
	if err != nil {
		t.Fatal(err)
	}
	if relErr(g, 0.87334) > 1e-5 {
		t.Errorf("γgs = %.6f, want 0.87334", g)
	}
	// Unknown separator conditions leave the gravity unchanged.
	g, err = VasquezBeggsGasGravity(Oil{API: 30, GasGravity: 0.7, Temperature: 200})
	if err != nil || g != 0.7 {
		t.Errorf("γgs with unknown separator = %v, %v; want 0.7", g, err)
	}
}

// TestVelarde checks the end points and the monotonic shape of Velarde's Rs(p).
func TestVelarde(t *testing.T) {
	o := Oil{API: 35, GasGravity: 0.8, Temperature: 200}
	const pb, rsb = 2500.0, 600.0
	prev := -1.0
	for p := 14.7; p <= pb; p += 50 {
		rs, err := VelardeSolutionGOR(p, pb, rsb, o)
		if err != nil {
			t.Fatalf("p=%g: %v", p, err)
		}
		if rs < prev || rs < 0 || rs > rsb {
			t.Fatalf("p=%g: Rs = %g after %g", p, rs, prev)
		}
		prev = rs
	}
	if rs, _ := VelardeSolutionGOR(pb, pb, rsb, o); rs != rsb {
		t.Errorf("Rs(Pb) = %g, want Rsb", rs)
	}
	if rs, _ := VelardeSolutionGOR(pb-1, pb, rsb, o); relErr(rs, rsb) > 0.01 {
		t.Errorf("Rs just below Pb = %g, want ≈ Rsb", rs)
	}
}

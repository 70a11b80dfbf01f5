package fit

import (
	"math"
	"strconv"
	"testing"

	"labmatch/lab"
	"labmatch/samples"
)

// Multiplier and shift: Bo data made as 1 + m·(Bo − 1) + s with no noise give back m and s.
func TestMultiplierShiftRecovery(t *testing.T) {
	ds := synthDatasetNoise(t, Bo, "standing", 1.1, 3, 0)
	const shift = 0.012 // rb/STB
	for i := range ds.Points[Bo] {
		ds.Points[Bo][i].Lab += shift
	}
	r, err := Tune(ds, Bo, "standing", Options{Depth: DepthShape})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(r.Params.Multiplier-1.1) > 1e-3 || math.Abs(r.Params.Shift-shift) > 2e-4 {
		t.Errorf("params %+v, want multiplier 1.1 and shift %g", r.Params, shift)
	}
	if _, ok := r.CI95["shift"]; !ok {
		t.Error("no interval for the shift")
	}
}

// On exact data every loss finds the same multiplier; with one gross outlier the Huber loss
// stays closer to the truth than squared relative errors.
func TestLosses(t *testing.T) {
	ds := synthDatasetNoise(t, Bo, "standing", 0.92, 4, 0)
	for _, l := range []Loss{Relative, Absolute, Huber} {
		r, err := Tune(ds, Bo, "standing", Options{Loss: l})
		if err != nil {
			t.Fatal(err)
		}
		if math.Abs(r.Params.Multiplier-0.92) > 1e-4 {
			t.Errorf("%s: multiplier %.6f on exact data, want 0.92", l, r.Params.Multiplier)
		}
	}
	ds.Points[Bo][4].Lab *= 1.06 // a 6 % outlier
	sq, err := Tune(ds, Bo, "standing", Options{})
	if err != nil {
		t.Fatal(err)
	}
	hu, err := Tune(ds, Bo, "standing", Options{Loss: Huber, HuberDelta: 0.005})
	if err != nil {
		t.Fatal(err)
	}
	if math.Abs(hu.Params.Multiplier-0.92) >= math.Abs(sq.Params.Multiplier-0.92) {
		t.Errorf("Huber %.5f is not closer to 0.92 than least squares %.5f", hu.Params.Multiplier, sq.Params.Multiplier)
	}
}

// The tuned model on a demo report: an exact Pb/Rs inverse pair, continuous at Pb, and the
// usual trends (common practice: Rs constant and Bo falling above Pb, viscosity rising).
func TestModelConsistency(t *testing.T) {
	for _, s := range samples.Specs {
		ds := demoDataset(t, s.ID)
		res, err := TuneAll(ds, nil, Options{})
		if err != nil {
			t.Fatal(err)
		}
		m, err := NewModel(ds, res, Options{})
		if err != nil {
			t.Fatal(err)
		}
		if rs, _ := m.Rs(m.Pb * (1 - 1e-12)); math.Abs(rs/m.Rsb-1) > 1e-6 {
			t.Errorf("%s: Rs just below the tuned Pb %.6g, want Rsb %.6g", s.ID, rs, m.Rsb)
		}
		// The tuned Pb honours the report's within the fit (the Pb point weighs as all Rs points).
		if math.Abs(m.Pb/ds.Pb-1) > 0.01 {
			t.Errorf("%s: tuned Pb %.1f, report %.1f", s.ID, m.Pb, ds.Pb)
		}
		below, _ := m.At(m.Pb * (1 - 1e-9))
		above, _ := m.At(m.Pb * (1 + 1e-9))
		if math.Abs(below.Bo/above.Bo-1) > 1e-6 || math.Abs(below.OilViscosity/above.OilViscosity-1) > 1e-6 {
			t.Errorf("%s: not continuous at Pb: %+v / %+v", s.ID, below, above)
		}
		// Ideal-gas limit (common practice): the tuned Z tends to 1 as the pressure falls.
		if atm, err := m.At(14.7); err != nil || math.Abs(atm.Z-1) > 0.005 {
			t.Errorf("%s: tuned Z at 14.7 psia %.4f (%v), want within 0.005 of 1", s.ID, atm.Z, err)
		}
		prev, err := m.At(100)
		if err != nil {
			t.Fatal(err)
		}
		for p := 200.0; p < m.Pb+4000; p += 100 {
			st, err := m.At(p)
			if err != nil {
				t.Fatalf("%s: At(%g): %v", s.ID, p, err)
			}
			if p <= m.Pb && (st.Rs < prev.Rs || st.Bo < prev.Bo) {
				t.Errorf("%s: Rs or Bo falls as p rises to %g below Pb", s.ID, p)
			}
			if prev.Pressure > m.Pb && (st.Bo > prev.Bo || st.OilViscosity < prev.OilViscosity || st.Rs != m.Rsb) {
				t.Errorf("%s: above Pb at %g: Bo must fall, viscosity rise, Rs stay", s.ID, p)
			}
			if st.Bg >= prev.Bg {
				t.Errorf("%s: Bg rises with pressure at %g", s.ID, p)
			}
			prev = st
		}
	}
}

// A per-property depth overrides the common one for that property only (behaviour).
func TestPropertyDepth(t *testing.T) {
	ds := demoDataset(t, "tr3-black")
	res, err := TuneAll(ds, nil, Options{Depth: DepthMultiplier, PropertyDepth: map[PropertyID]Depth{Bo: DepthPublished, Pb: ""}})
	if err != nil {
		t.Fatal(err)
	}
	if res[Bo].Depth != DepthPublished || res[Co].Depth != DepthMultiplier || res[Pb].Depth != DepthShape {
		t.Errorf("depths bo %s, co %s, pb %s; want published, multiplier and the leave-one-out choice (shape)", res[Bo].Depth, res[Co].Depth, res[Pb].Depth)
	}
}

// Within its threshold the Huber loss is the squared error (Huber, P.J. (1964), "Robust
// Estimation of a Location Parameter", Ann. Math. Statist. 35 (1), eq. for ρ): with a δ larger
// than every residual, each rung of the ladder must reach the optimum of the relative loss, and
// its leave-one-out refits too. Nelder–Mead stopped at the shallower rung's optimum here (the
// refit rung's training error equal to the shape rung's, the leave-one-out error equal to the
// training error: the left-out fits never moved).
func TestHuberWithinDeltaIsRelative(t *testing.T) {
	r, err := lab.ReadFolder("../testdata/published/good-oil-well-4")
	if err != nil {
		t.Fatal(err)
	}
	ds, err := NewDataset(r)
	if err != nil {
		t.Fatal(err)
	}
	const tol = 1e-3 // percentage points of AARE
	for _, c := range []struct {
		prop   PropertyID
		family string
	}{{Bo, "al-marhoun"}, {MuSat, "beggs-robinson"}, {Pb, "valko-mccain"}, {Co, "petrosky-farshad"}} {
		rel, err := Tune(ds, c.prop, c.family, Options{Depth: DepthRefit})
		if err != nil {
			t.Fatal(err)
		}
		hub, err := Tune(ds, c.prop, c.family, Options{Depth: DepthRefit, Loss: Huber, HuberDelta: 0.5})
		if err != nil {
			t.Fatal(err)
		}
		for i, a := range rel.Ladder {
			b := hub.Ladder[i]
			if a.Skipped != "" || b.Skipped != "" {
				continue
			}
			if math.Abs(a.Tuned.AARE-b.Tuned.AARE) > tol {
				t.Errorf("%s %s %s: Huber training AARE %.4f %%, relative %.4f %%", c.prop, c.family, a.Depth, b.Tuned.AARE, a.Tuned.AARE)
			}
			if (a.LOO == nil) != (b.LOO == nil) || a.LOO != nil && math.Abs(*a.LOO-*b.LOO) > tol {
				t.Errorf("%s %s %s: Huber leave-one-out %v, relative %v", c.prop, c.family, a.Depth, pct(b.LOO), pct(a.LOO))
			}
		}
	}
}

func pct(v *float64) string {
	if v == nil {
		return "n/a"
	}
	return strconv.FormatFloat(*v, 'f', 4, 64)
}

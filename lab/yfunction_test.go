package lab

import (
	"errors"
	"math"
	"testing"
)

// Tolerances of the Y-function tests. The synthetic CCEs are exact (or rounded to five
// decimals, as printed), so the fit must recover its line and saturation pressure closely.
const (
	yRecoverTol  = 0.005 // relative: slope, intercept and Psat recovered within 0.5 %
	yIdentityTol = 1e-9  // relative: algebraic identities (inverse of the Y definition)
	coTol        = 1e-6  // relative: compressibility of an exact exponential volume law
)

// syntheticCCE builds an invented CCE (invented numbers; no published source) from a known
// Y line and compressibility law: below psatTrue, V/V(psatTrue) = 1 + (psatTrue − p)/(p·Y)
// with Y = a + b·p (the definition of Y, inverted); at and above it,
// ln V/V(psatTrue) = −c1·x − c2·x², x = p − psatTrue (the definition of co). The volumes
// are then normalised to V at pNorm (the pressure a laboratory called Psat) and rounded to
// `decimals` places (0: not rounded). Lines count from 2 (line 1 is the header).
func syntheticCCE(a, b, c1, c2, psatTrue, pNorm float64, pressures []float64, decimals int) []CCEPoint {
	vol := func(p float64) float64 {
		if p < psatTrue {
			return 1 + (psatTrue-p)/(p*(a+b*p))
		}
		x := p - psatTrue
		return math.Exp(-c1*x - c2*x*x)
	}
	vn := vol(pNorm)
	pts := make([]CCEPoint, len(pressures))
	for i, p := range pressures {
		v := vol(p) / vn
		if decimals > 0 {
			s := math.Pow(10, float64(decimals))
			v = math.Round(v*s) / s
		}
		pts[i] = CCEPoint{Line: i + 2, Pressure: p, RelVolume: v}
	}
	return pts
}

// cceGrid returns descending CCE pressures around psat: single-phase steps up to 5000 psia,
// psat itself, and two-phase steps down to 800 psia.
func cceGrid(psat float64) []float64 {
	ps := []float64{5000, 4500, 4000, 3500, 3000, 2750}
	var out []float64
	for _, p := range ps {
		if p > psat {
			out = append(out, p)
		}
	}
	out = append(out, psat)
	for _, p := range []float64{2400, 2300, 2150, 2000, 1800, 1600, 1400, 1200, 1000, 800} {
		if p < psat {
			out = append(out, p)
		}
	}
	return out
}

func TestFitYRecoversLine(t *testing.T) {
	// Invented straight Y lines typical of black oils (Y of order 1.5–5 over the two-phase
	// range, rising with pressure); the fit must return them.
	tests := []struct {
		name     string
		a, b     float64
		psat     float64
		decimals int
	}{
		{"exact volumes", 1.80, 6.0e-4, 2500, 0},
		{"volumes printed to 5 decimals", 1.80, 6.0e-4, 2500, 5},
		{"steeper line, lower Psat", 1.20, 1.1e-3, 2450, 5},
		{"flat line", 3.00, 1.0e-5, 2500, 0},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			pts := syntheticCCE(tt.a, tt.b, 1.2e-5, 0, tt.psat, tt.psat, cceGrid(tt.psat), tt.decimals)
			f, err := FitY(tt.psat, pts)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(f.A, tt.a); e > yRecoverTol {
				t.Errorf("intercept %g, want %g (rel. err %.2g)", f.A, tt.a, e)
			}
			if e := relErr(f.B, tt.b); e > yRecoverTol && tt.b > 1e-4 {
				t.Errorf("slope %g, want %g (rel. err %.2g)", f.B, tt.b, e)
			}
			if len(f.Outliers()) != 0 {
				t.Errorf("outliers on a straight line: %+v", f.Outliers())
			}
			if f.R2 < 0.999 && tt.b > 1e-4 {
				t.Errorf("r² = %g on a straight line", f.R2)
			}
			if len(f.Points) != 10 {
				t.Errorf("%d two-phase points used, want 10", len(f.Points))
			}
			est, err := ImpliedPsat(tt.psat, pts)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(est.Psat, tt.psat); e > yRecoverTol {
				t.Errorf("implied Psat %g, want %g (rel. err %.2g)", est.Psat, tt.psat, e)
			}
		})
	}
}

func TestImpliedPsatMisplacedSaturationPoint(t *testing.T) {
	// The laboratory normalised the volumes at 2500 psia but the straight-Y saturation
	// pressure is elsewhere (invented): the estimate must find it. Constant compressibility
	// so that the single-phase trend is exact.
	tests := []struct {
		name      string
		psatTrue  float64
		reportedP float64
	}{
		{"lab Psat too high", 2480, 2500},
		{"lab Psat too low", 2540, 2500},
		{"lab Psat right", 2500, 2500},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			grid := append([]float64{5000, 4000, 3500, 3000, 2750, 2600}, 2500)
			grid = append(grid, 2400, 2300, 2150, 2000, 1800, 1600, 1400, 1200, 1000, 800)
			pts := syntheticCCE(1.8, 6e-4, 1.2e-5, 0, tt.psatTrue, tt.reportedP, grid, 0)
			est, err := ImpliedPsat(tt.reportedP, pts)
			if err != nil {
				t.Fatal(err)
			}
			if e := relErr(est.Psat, tt.psatTrue); e > yRecoverTol/10 {
				t.Errorf("implied Psat %.2f, want %.2f (rel. err %.2g)", est.Psat, tt.psatTrue, e)
			}
			if e := relErr(est.Fit.B, 6e-4); e > yRecoverTol {
				t.Errorf("slope at the implied Psat %g, want 6e-4", est.Fit.B)
			}
		})
	}
}

func TestFitYFlagsOutlier(t *testing.T) {
	// One invented volume misread by +0.01 (a slipped digit in the second decimal).
	for _, idx := range []int{9, 11, 14} { // 2300, 2000 and 1400 psia in cceGrid(2500)
		pts := syntheticCCE(1.8, 6e-4, 1.2e-5, 0, 2500, 2500, cceGrid(2500), 5)
		pts[idx].RelVolume += 0.01
		f, err := FitY(2500, pts)
		if err != nil {
			t.Fatal(err)
		}
		out := f.Outliers()
		if len(out) != 1 || out[0].Line != pts[idx].Line {
			t.Errorf("point at %g psia: outliers %+v, want only line %d", pts[idx].Pressure, out, pts[idx].Line)
			continue
		}
		if e := relErr(f.A, 1.8); e > yRecoverTol {
			t.Errorf("refit without the outlier: intercept %g, want 1.8", f.A)
		}
		if e := relErr(f.B, 6e-4); e > yRecoverTol {
			t.Errorf("refit without the outlier: slope %g, want 6e-4", f.B)
		}
		est, err := ImpliedPsat(2500, pts)
		if err != nil {
			t.Fatal(err)
		}
		if e := relErr(est.Psat, 2500); e > yRecoverTol {
			t.Errorf("implied Psat %g with an outlier set aside, want 2500", est.Psat)
		}
	}
}

func TestYSmoothedRelVolumeInvertsY(t *testing.T) {
	// Identity: the smoothed V/Vsat of the fitted line reproduces exact synthetic volumes.
	pts := syntheticCCE(1.8, 6e-4, 1.2e-5, 0, 2500, 2500, cceGrid(2500), 0)
	f, err := FitY(2500, pts)
	if err != nil {
		t.Fatal(err)
	}
	sm, err := f.SmoothedRelVolumes()
	if err != nil {
		t.Fatal(err)
	}
	for i, pt := range f.Points {
		if e := relErr(sm[i], pt.RelVolume); e > yIdentityTol {
			t.Errorf("%g psia: smoothed V/Vsat %.12g, want %.12g", pt.Pressure, sm[i], pt.RelVolume)
		}
	}
	if v, err := f.RelVolume(2500); err != nil || v != 1 {
		t.Errorf("smoothed V/Vsat at Psat = %g, %v; want exactly 1", v, err)
	}
	if _, err := f.RelVolume(2600); err == nil {
		t.Error("smoothed V/Vsat above Psat: no error")
	}
}

func TestYErrors(t *testing.T) {
	few := []CCEPoint{{Pressure: 3000, RelVolume: 0.99}, {Pressure: 2500, RelVolume: 1},
		{Pressure: 2000, RelVolume: 1.1}, {Pressure: 1500, RelVolume: 1.3}}
	if _, err := FitY(2500, few); !errors.Is(err, ErrYTooFewPoints) {
		t.Errorf("two two-phase points: err %v, want ErrYTooFewPoints", err)
	}
	for _, psat := range []float64{0, -1, math.NaN(), math.Inf(1)} {
		if _, err := FitY(psat, few); err == nil {
			t.Errorf("FitY(Psat = %g): no error", psat)
		}
	}
	bad := []struct{ psat, p, v float64 }{
		{2500, 2500, 1.1}, {2500, 2600, 1.1}, {2500, 2000, 1}, {2500, 2000, 0.9},
		{2500, 0, 1.1}, {2500, 2000, math.NaN()}, {2500, 2000, math.Inf(1)},
	}
	for _, b := range bad {
		if y, err := YValue(b.psat, b.p, b.v); err == nil {
			t.Errorf("YValue(%g, %g, %g) = %g, want an error", b.psat, b.p, b.v, y)
		}
	}
	// Garbage points are skipped, never a panic or a NaN.
	junk := append(syntheticCCE(1.8, 6e-4, 1.2e-5, 0, 2500, 2500, cceGrid(2500), 5),
		CCEPoint{Pressure: math.NaN(), RelVolume: 1.2}, CCEPoint{Pressure: 1700, RelVolume: math.NaN()},
		CCEPoint{Pressure: -5, RelVolume: 2})
	f, err := FitY(2500, junk)
	if err != nil || math.IsNaN(f.A) || math.IsNaN(f.B) || math.IsNaN(f.R2) {
		t.Errorf("FitY with junk points: %+v, %v", f, err)
	}
	if _, err := ImpliedPsat(2500, junk); err != nil {
		t.Errorf("ImpliedPsat with junk points: %v", err)
	}
	if _, _, err := UndersaturatedCo(2500, few[:2]); err != nil {
		t.Errorf("two single-phase points: %v", err)
	}
	if _, _, err := UndersaturatedCo(2500, few[1:]); !errors.Is(err, ErrCoTooFewPoints) {
		t.Errorf("one single-phase point: err %v, want ErrCoTooFewPoints", err)
	}
}

func TestUndersaturatedCo(t *testing.T) {
	// co = −d ln V/dp (definition of isothermal compressibility). Invented volume laws:
	// constant co, and co falling linearly with pressure (ln V quadratic).
	tests := []struct {
		name   string
		c1, c2 float64
		grid   []float64
	}{
		{"constant co", 1.5e-5, 0, []float64{5000, 4000, 3000, 2500}},
		{"co falling with pressure", 1.2e-5, -8e-10, []float64{5000, 4500, 4000, 3500, 3000, 2750, 2500}},
		{"two points: linear fit", 1.5e-5, 0, []float64{3000, 2500}},
	}
	for _, tt := range tests {
		t.Run(tt.name, func(t *testing.T) {
			const psat = 2500.0
			pts := syntheticCCE(1.8, 6e-4, tt.c1, tt.c2, psat, psat, tt.grid, 0)
			cp, fit, err := UndersaturatedCo(psat, pts)
			if err != nil {
				t.Fatal(err)
			}
			if len(cp) != len(tt.grid)-1 {
				t.Fatalf("%d pointwise values, want %d", len(cp), len(tt.grid)-1)
			}
			for _, c := range cp {
				// The secant of ln V over [P1, P2] is exact at the midpoint for ln V quadratic.
				want := tt.c1 + 2*tt.c2*(c.Pressure-psat)
				if e := relErr(c.Co, want); e > coTol {
					t.Errorf("co between %g and %g psia = %g, want %g", c.P1, c.P2, c.Co, want)
				}
			}
			for _, p := range []float64{2500, 3200, 4800} {
				want := tt.c1 + 2*tt.c2*(p-psat)
				if e := relErr(fit.Co(p), want); e > coTol {
					t.Errorf("fitted co(%g) = %g, want %g", p, fit.Co(p), want)
				}
			}
			if e := relErr(fit.RelVolume(psat), 1); e > coTol {
				t.Errorf("fitted V/Vsat at Psat = %g, want 1", fit.RelVolume(psat))
			}
		})
	}
}

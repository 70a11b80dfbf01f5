package correlations

import (
	"errors"
	"math"
	"testing"
)

// The grid of the brief: API 15–50, γg 0.6–1.2, T 100–300 °F, Rsb 50–2000 scf/STB,
// p 100–8000 psia.
var (
	gridAPI = []float64{15, 22, 30, 30.5, 40, 50}
	gridGG  = []float64{0.6, 0.75, 0.9, 1.2}
	gridT   = []float64{100, 160, 220, 300}
	gridRsb = []float64{50, 150, 400, 800, 1400, 2000}
	gridP   = []float64{100, 500, 1000, 2000, 4000, 6000, 8000}
)

const tolInverse = 1e-6 // Rs(Pb(Rsb)) = Rsb, relative (brief)

func forGrid(f func(o Oil)) {
	for _, api := range gridAPI {
		for _, gg := range gridGG {
			for _, tf := range gridT {
				f(Oil{API: api, GasGravity: gg, Temperature: tf})
			}
		}
	}
}

// TestInversePairs checks that SolutionGOR is the exact inverse of BubblePoint for every
// family, over the whole grid, with and without separator conditions.
func TestInversePairs(t *testing.T) {
	for _, f := range SolutionGasFamilies() {
		n := 0
		forGrid(func(o Oil) {
			for _, sep := range [][2]float64{{0, 0}, {164.7, 80}} {
				o.SepPressure, o.SepTemperature = sep[0], sep[1]
				for _, rsb := range gridRsb {
					pb, err := f.BubblePoint(rsb, o)
					if err != nil {
						t.Errorf("%s %+v Rsb=%g: Pb: %v", f.ID, o, rsb, err)
						continue
					}
					rs, err := f.SolutionGOR(pb, o)
					if err != nil {
						t.Errorf("%s %+v Rsb=%g: Rs(%g): %v", f.ID, o, rsb, pb, err)
						continue
					}
					if relErr(rs, rsb) > tolInverse {
						t.Errorf("%s %+v: Rs(Pb(%g)) = %.10g", f.ID, o, rsb, rs)
					}
					n++
				}
			}
		})
		if n == 0 {
			t.Errorf("%s: no grid point checked", f.ID)
		}
	}
}

// TestSolutionGORRises checks that Rs rises with pressure below the bubble point, and that Pb
// rises with Rsb.
func TestSolutionGORRises(t *testing.T) {
	for _, f := range SolutionGasFamilies() {
		forGrid(func(o Oil) {
			prev := -1.0
			for _, p := range gridP {
				rs, err := f.SolutionGOR(p, o)
				if err != nil {
					t.Errorf("%s %+v p=%g: %v", f.ID, o, p, err)
					return
				}
				if !(rs >= prev) || !isFinite(rs) {
					t.Errorf("%s %+v: Rs(%g) = %g after %g", f.ID, o, p, rs, prev)
				}
				prev = rs
			}
			prevPb := 0.0
			for _, rsb := range gridRsb {
				pb, err := f.BubblePoint(rsb, o)
				if err != nil || !(pb > prevPb) {
					t.Errorf("%s %+v: Pb(%g) = %g, %v after %g", f.ID, o, rsb, pb, err, prevPb)
				}
				prevPb = pb
			}
		})
	}
}

// TestFVFTrends checks that every Bo family is finite and > 1 over the grid and rises with Rs
// and with T.
func TestFVFTrends(t *testing.T) {
	for _, f := range OilFVFFamilies() {
		for _, api := range gridAPI {
			for _, gg := range gridGG {
				// Bo against Rs at fixed T.
				for _, tf := range gridT {
					o := Oil{API: api, GasGravity: gg, Temperature: tf}
					prev := 0.0
					for _, rs := range gridRsb {
						bo, err := f.FVF(3000, rs, o)
						if err != nil || !(bo > prev) || !(bo > 1) {
							t.Errorf("%s %+v Rs=%g: Bo = %g, %v after %g", f.ID, o, rs, bo, err, prev)
						}
						prev = bo
					}
				}
				// Bo against T at fixed Rs. Vasquez–Beggs' API ≤ 30 set has a negative Rs·(T − 60)
				// coefficient and falls with T above Rs = 1.751e−5/1.811e−8 ≈ 967 scf/STB.
				for _, rs := range gridRsb {
					if f.ID == "vasquez-beggs" && api <= 30 && rs > 1.751e-5/1.811e-8 {
						continue
					}
					prev := 0.0
					for _, tf := range gridT {
						o := Oil{API: api, GasGravity: gg, Temperature: tf}
						bo, err := f.FVF(3000, rs, o)
						if err != nil || !(bo > prev) {
							t.Errorf("%s %+v Rs=%g: Bo = %g, %v after %g", f.ID, o, rs, bo, err, prev)
						}
						prev = bo
					}
				}
			}
		}
	}
}

// TestFVFFiniteOverPressure runs the pressure-dependent McCain family (and the others, which
// ignore p) over the pressure grid.
func TestFVFFiniteOverPressure(t *testing.T) {
	for _, f := range OilFVFFamilies() {
		forGrid(func(o Oil) {
			for _, p := range gridP {
				for _, rs := range gridRsb {
					bo, err := f.FVF(p, rs, o)
					if err != nil || !isFinite(bo) || bo < 0.95 || bo > 4 {
						t.Errorf("%s %+v p=%g Rs=%g: Bo = %g, %v", f.ID, o, p, rs, bo, err)
					}
				}
			}
		})
	}
}

// TestUndersaturatedTrends checks co > 0, RelativeVolume = 1 at pb, < 1 above it and falling
// with p, for the undersaturated families over the grid. Vasquez–Beggs gives a negative co for
// heavy, gas-poor oils (a known flaw of the linear numerator); it must then return ErrInput,
// and it must be positive for Rsb ≥ 250 scf/STB.
func TestUndersaturatedTrends(t *testing.T) {
	for _, id := range []string{"vasquez-beggs", "petrosky-farshad", "spivey-valko-mccain"} {
		f, _ := CompressibilityByID(id)
		forGrid(func(o Oil) {
			for _, rsb := range gridRsb {
				pb := 1500.0
				prevRV := 1.0
				for _, dp := range []float64{0, 200, 1000, 3000, 6500} {
					p := pb + dp
					co, err := f.Co(p, pb, rsb, o)
					if err != nil {
						if id == "vasquez-beggs" && rsb < 250 && errors.Is(err, ErrInput) {
							break
						}
						t.Errorf("%s %+v Rsb=%g p=%g: %v", id, o, rsb, p, err)
						break
					}
					if !(co > 0) || co > 1e-3 {
						t.Errorf("%s %+v Rsb=%g p=%g: co = %g", id, o, rsb, p, co)
					}
					rv, err := f.RelativeVolume(p, pb, rsb, o)
					switch {
					case err != nil:
						t.Errorf("%s %+v Rsb=%g p=%g: RV: %v", id, o, rsb, p, err)
					case dp == 0 && rv != 1:
						t.Errorf("%s: RV(pb) = %g, want 1", id, rv)
					case dp > 0 && !(rv < prevRV):
						t.Errorf("%s %+v Rsb=%g p=%g: RV = %g after %g", id, o, rsb, p, rv, prevRV)
					}
					prevRV = rv
				}
			}
		})
	}
}

// gaussLegendre8 integrates f over [a, b] with n panels of the 8-point Gauss–Legendre rule
// (nodes and weights from Abramowitz and Stegun, Table 25.4).
func gaussLegendre8(f func(float64) float64, a, b float64, n int) float64 {
	x := [4]float64{0.1834346424956498, 0.5255324099163290, 0.7966664774136267, 0.9602898564975363}
	w := [4]float64{0.3626837833783620, 0.3137066458778873, 0.2223810344533745, 0.1012285362903763}
	h := (b - a) / float64(n)
	sum := 0.0
	for i := range n {
		m := a + (float64(i)+0.5)*h
		for k := range 4 {
			d := 0.5 * h * x[k]
			sum += w[k] * (f(m-d) + f(m+d))
		}
	}
	return 0.5 * h * sum
}

// TestRelativeVolumeIsIntegralOfCo checks every closed-form RelativeVolume against
// exp(−∫co dp) computed by Gauss–Legendre quadrature of the family's own Co: this ties the
// instantaneous co of Spivey et al. to their cumulative correlation.
func TestRelativeVolumeIsIntegralOfCo(t *testing.T) {
	const tolQuad = 1e-9
	for _, id := range []string{"vasquez-beggs", "petrosky-farshad", "spivey-valko-mccain"} {
		f, _ := CompressibilityByID(id)
		for i, s := range sixOils {
			o := sixOil(i)
			for _, p := range []float64{s.pb + 100, s.pb + 1500, s.pb + 5000} {
				var ferr error
				integral := gaussLegendre8(func(x float64) float64 {
					co, err := f.Co(x, s.pb, s.rsb, o)
					if err != nil {
						ferr = err
					}
					return co
				}, s.pb, p, 64)
				rv, err := f.RelativeVolume(p, s.pb, s.rsb, o)
				if err != nil || ferr != nil {
					t.Fatalf("%s oil %d: %v %v", id, i+1, err, ferr)
				}
				if math.Abs(rv-math.Exp(-integral)) > tolQuad {
					t.Errorf("%s oil %d p=%g: RV = %.12f, exp(−∫co) = %.12f", id, i+1, p, rv, math.Exp(-integral))
				}
			}
		}
	}
}

// TestMcCainRollinsVillena checks the below-Pb family: co > 0, falling with p, refused above
// Pb, and no relative volume.
func TestMcCainRollinsVillena(t *testing.T) {
	f, err := CompressibilityByID("mccain-rollins-villena")
	if err != nil {
		t.Fatal(err)
	}
	forGrid(func(o Oil) {
		for _, rsb := range gridRsb {
			prev := math.Inf(1)
			for _, p := range []float64{100, 500, 1000, 2000, 4000} {
				co, err := f.Co(p, 4000, rsb, o)
				if err != nil || !(co > 0) || !(co < prev) {
					t.Errorf("%+v Rsb=%g p=%g: co = %g, %v", o, rsb, p, co, err)
				}
				prev = co
			}
		}
	})
	o := sixOil(0)
	if _, err := f.Co(3000, 2000, 500, o); !errors.Is(err, ErrInput) {
		t.Errorf("co above Pb: err = %v, want ErrInput", err)
	}
	if _, err := f.RelativeVolume(3000, 2000, 500, o); !errors.Is(err, ErrInput) {
		t.Errorf("RelativeVolume: err = %v, want ErrInput", err)
	}
}

// TestBadInput checks that unusable inputs give ErrInput (never a panic, NaN or Inf) from
// every oil function.
func TestBadInput(t *testing.T) {
	good := Oil{API: 35, GasGravity: 0.8, Temperature: 200}
	bad := []Oil{
		{API: 0, GasGravity: 0.8, Temperature: 200},
		{API: -5, GasGravity: 0.8, Temperature: 200},
		{API: math.NaN(), GasGravity: 0.8, Temperature: 200},
		{API: 35, GasGravity: 0, Temperature: 200},
		{API: 35, GasGravity: math.Inf(1), Temperature: 200},
		{API: 35, GasGravity: 0.8, Temperature: -500},
		{API: 35, GasGravity: 0.8, Temperature: math.NaN()},
		{API: 35, GasGravity: 0.8, Temperature: 200, SepPressure: -1},
	}
	type call struct {
		name string
		fn   func(o Oil, x float64) (float64, error)
	}
	var calls []call
	for _, f := range SolutionGasFamilies() {
		calls = append(calls,
			call{f.ID + " Pb", func(o Oil, x float64) (float64, error) { return f.BubblePoint(x*500, o) }},
			call{f.ID + " Rs", func(o Oil, x float64) (float64, error) { return f.SolutionGOR(x*2000, o) }})
	}
	for _, f := range OilFVFFamilies() {
		calls = append(calls, call{f.ID + " Bo", func(o Oil, x float64) (float64, error) { return f.FVF(x*2000, x*500, o) }})
	}
	for _, f := range CompressibilityFamilies() {
		if f.ID == "mccain-rollins-villena" {
			calls = append(calls, call{f.ID + " co", func(o Oil, x float64) (float64, error) { return f.Co(x*1000, 2000, 500, o) }})
			continue
		}
		calls = append(calls,
			call{f.ID + " co", func(o Oil, x float64) (float64, error) { return f.Co(x*3000, 2000, 500, o) }},
			call{f.ID + " RV", func(o Oil, x float64) (float64, error) { return f.RelativeVolume(x*3000, 2000, 500, o) }})
	}
	calls = append(calls,
		call{"OilDensity", func(o Oil, x float64) (float64, error) { return OilDensity(500*x, 1.3*x, o) }},
		call{"Velarde", func(o Oil, x float64) (float64, error) { return VelardeSolutionGOR(1000*x, 2000, 500, o) }})
	for _, c := range calls {
		if v, err := c.fn(good, 1); err != nil || !isFinite(v) {
			t.Errorf("%s good input: %g, %v", c.name, v, err)
		}
		for _, o := range bad {
			if _, err := c.fn(o, 1); !errors.Is(err, ErrInput) {
				t.Errorf("%s %+v: err = %v, want ErrInput", c.name, o, err)
			}
		}
		for _, x := range []float64{-1, math.NaN(), math.Inf(1)} {
			if _, err := c.fn(good, x); !errors.Is(err, ErrInput) {
				t.Errorf("%s x=%g: err = %v, want ErrInput", c.name, x, err)
			}
		}
	}
	// Closed forms whose published Pb reaches zero at a positive Rsb are continued linearly:
	// a tiny Rsb gives a small positive Pb, still exactly inverse.
	for _, id := range []string{"standing", "petrosky-farshad"} {
		f, _ := SolutionGasByID(id)
		heavy := Oil{API: 15, GasGravity: 0.75, Temperature: 100}
		pb, err := f.BubblePoint(1, heavy)
		if err != nil || !(pb > 0 && pb < pLinear) {
			t.Errorf("%s tiny Rsb: Pb = %g, %v", id, pb, err)
		}
		if rs, _ := f.SolutionGOR(pb, heavy); relErr(rs, 1) > tolInverse {
			t.Errorf("%s tiny Rsb: Rs(Pb) = %g, want 1", id, rs)
		}
	}
	// Undersaturated families refuse p < pb.
	if _, err := SpiveyCo(1000, 2000, 500, good); !errors.Is(err, ErrInput) {
		t.Errorf("Spivey p < pb: err = %v", err)
	}
}

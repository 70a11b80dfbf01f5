package export

import (
	"errors"
	"io/fs"
	"math"
	"path/filepath"
	"testing"

	"labmatch/fit"
	"labmatch/samples"
)

// roundTripTol is the requirement: a loaded tuning file reproduces every value to 1e-12.
const roundTripTol = 1e-12

func TestTuningFileRoundTrip(t *testing.T) {
	for _, s := range samples.Specs {
		t.Run(s.ID, func(t *testing.T) {
			r, err := samples.Load(s.ID)
			if err != nil {
				t.Fatal(err)
			}
			ds, err := fit.NewDataset(r)
			if err != nil {
				t.Fatal(err)
			}
			opts := fit.Options{Excluded: map[fit.PropertyID][]int{fit.Bo: {2}}}
			res, err := fit.TuneAll(ds, nil, opts)
			if err != nil {
				t.Fatal(err)
			}
			path := filepath.Join(t.TempDir(), "tuning.json")
			if err := SaveTuning(path, NewTuningFile("labmatch test", r, res, opts, ds.Notes), false); err != nil {
				t.Fatal(err)
			}
			if err := SaveTuning(path, NewTuningFile("labmatch test", r, res, opts, nil), false); !errors.Is(err, fs.ErrExist) {
				t.Errorf("second save without force: %v, want fs.ErrExist", err)
			}
			tf, err := LoadTuning(path)
			if err != nil {
				t.Fatal(err)
			}
			if err := tf.Matches(r, false); err != nil {
				t.Fatal(err)
			}
			want, err := fit.NewModel(ds, res, opts)
			if err != nil {
				t.Fatal(err)
			}
			got, err := fit.NewModel(ds, tf.Results(), tf.FitOptions())
			if err != nil {
				t.Fatal(err)
			}
			for p := 100.0; p < 2*r.Fluid.Pb+2000; p += 137 {
				a, err1 := want.At(p)
				b, err2 := got.At(p)
				if err1 != nil || err2 != nil {
					t.Fatalf("At(%g): %v / %v", p, err1, err2)
				}
				for _, pair := range [][2]float64{{a.Rs, b.Rs}, {a.Bo, b.Bo}, {a.Co, b.Co}, {a.OilDensity, b.OilDensity},
					{a.OilViscosity, b.OilViscosity}, {a.Z, b.Z}, {a.Bg, b.Bg}, {a.GasViscosity, b.GasViscosity}} {
					if d := math.Abs(pair[0] - pair[1]); d > roundTripTol*math.Max(1, math.Abs(pair[0])) {
						t.Fatalf("At(%g): %v vs %v", p, a, b)
					}
				}
			}
			// Re-tuning with the recorded options gives the recorded parameters.
			again, err := fit.TuneAll(ds, choiceOf(tf), tf.FitOptions())
			if err != nil {
				t.Fatal(err)
			}
			for p, rr := range again {
				if rr.Params != res[p].Params {
					t.Errorf("%s: re-tuned %+v, recorded %+v", p, rr.Params, res[p].Params)
				}
			}
			// A changed report is refused unless forced.
			changed := *r
			changed.Fingerprint = "0000" + r.Fingerprint[4:]
			if err := tf.Matches(&changed, false); !errors.Is(err, ErrFingerprint) {
				t.Errorf("changed report: %v, want ErrFingerprint", err)
			}
			if err := tf.Matches(&changed, true); err != nil {
				t.Errorf("changed report with force: %v", err)
			}
		})
	}
}

func choiceOf(tf TuningFile) fit.Choice {
	c := fit.Choice{}
	for p, pt := range tf.Properties {
		c[fit.PropertyID(p)] = pt.Family
	}
	return c
}

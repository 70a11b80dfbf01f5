package export

import (
	"errors"
	"io/fs"
	"math"
	"os"
	"path/filepath"
	"reflect"
	"strings"
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
				if !reflect.DeepEqual(rr.Params, res[p].Params) {
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

// A damaged or hand-edited tuning file is refused with a reason.
func TestLoadTuningRefusesBadFiles(t *testing.T) {
	good := `{"format_version": 1, "options": {"mode": "multiplier", "loss": "relative"},
	 "properties": {"bo": {"family": "standing", "parameters": {"multiplier": 0.96, "shift": 0}}}}`
	cases := map[string]string{
		"bad mode":         strings.Replace(good, `"mode": "multiplier"`, `"mode": "bogus"`, 1),
		"shift in mult":    strings.Replace(good, `"shift": 0`, `"shift": 0.5`, 1),
		"unknown family":   strings.Replace(good, `"standing"`, `"nobody-1999"`, 1),
		"unknown property": strings.Replace(good, `"bo":`, `"bq":`, 1),
		"multiplier bound": strings.Replace(good, `0.96`, `3`, 1),
		"version":          strings.Replace(good, `"format_version": 1`, `"format_version": 9`, 1),
		"not json":         `{"format_version": 1,`,
		"bad loss":         strings.Replace(good, `"relative"`, `"cubic"`, 1),
	}
	dir := t.TempDir()
	ok := filepath.Join(dir, "good.json")
	if err := os.WriteFile(ok, []byte(good), 0o644); err != nil {
		t.Fatal(err)
	}
	if _, err := LoadTuning(ok); err != nil {
		t.Fatalf("good file refused: %v", err)
	}
	for name, text := range cases {
		p := filepath.Join(dir, strings.ReplaceAll(name, " ", "-")+".json")
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		if _, err := LoadTuning(p); err == nil {
			t.Errorf("%s: loaded, want an error", name)
		}
	}
}

// A version 1 file (one mode for every property) loads as version 2: multiplier+shift becomes
// the shape depth, parameters as recorded.
func TestLoadTuningVersion1(t *testing.T) {
	v1 := `{"format_version": 1, "options": {"mode": "multiplier+shift", "loss": "relative"},
	 "properties": {"bo": {"family": "standing", "parameters": {"multiplier": 0.96, "shift": 0.01}},
	                "pb": {"family": "standing", "parameters": {"multiplier": 1.05, "shift": 12}}}}`
	p := filepath.Join(t.TempDir(), "v1.json")
	if err := os.WriteFile(p, []byte(v1), 0o644); err != nil {
		t.Fatal(err)
	}
	tf, err := LoadTuning(p)
	if err != nil {
		t.Fatal(err)
	}
	if tf.FormatVersion != FormatVersion || tf.Options.Mode != "" {
		t.Errorf("upgraded file: version %d, mode %q", tf.FormatVersion, tf.Options.Mode)
	}
	res := tf.Results()
	if res[fit.Bo].Depth != fit.DepthShape || res[fit.Pb].Depth != fit.DepthShape {
		t.Errorf("depths %s, %s; want shape", res[fit.Bo].Depth, res[fit.Pb].Depth)
	}
	if q := res[fit.Pb].Params; q.Multiplier != 1.05 || q.Shift != 12 {
		t.Errorf("pb parameters %+v, want the recorded ones", q)
	}
}

// A tuning file that is not valid JSON, or holds a value of the wrong type, is refused with the
// line and column where the decoder stopped (behaviour test).
func TestLoadTuningErrorPosition(t *testing.T) {
	dir := t.TempDir()
	for _, tc := range []struct {
		name, text, want string
	}{
		{"garbage", "garbage{", ":1:1: not a tuning file"},
		{"truncated", "{\n  \"format_version\": 2,\n  \"options\": {", ":3:15: not a tuning file"},
		{"wrong type", "{\n  \"format_version\": \"two\"\n}", ":2:26: not a tuning file"}, // just past the value
		{"bad character", "{\n  \"format_version\": 2,\n  x\n}", ":3:3: not a tuning file"},
	} {
		p := filepath.Join(dir, tc.name+".json")
		if err := os.WriteFile(p, []byte(tc.text), 0o644); err != nil {
			t.Fatal(err)
		}
		_, err := LoadTuning(p)
		if err == nil || !strings.Contains(err.Error(), p+tc.want) {
			t.Errorf("%s: %v, want %q", tc.name, err, p+tc.want)
		}
	}
}

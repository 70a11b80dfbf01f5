package export

import (
	"path/filepath"
	"testing"

	"labmatch/fit"
)

func TestWithRecorded(t *testing.T) {
	tu := loadTuned(t, "tr3-black")
	path := filepath.Join(t.TempDir(), "t.json")
	if err := SaveTuning(path, NewTuningFile("labmatch test", tu.r, tu.results, fit.Options{}, nil), false); err != nil {
		t.Fatal(err)
	}
	tf, err := LoadTuning(path)
	if err != nil {
		t.Fatal(err)
	}
	applied, err := fit.Apply(tu.ds, tf.Results(), tf.FitOptions())
	if err != nil {
		t.Fatal(err)
	}
	got := WithRecorded(applied, tf.Results())
	for p, r := range tu.results {
		g := got[p]
		if g.Depth != r.Depth || len(g.Ladder) != len(r.Ladder) || (r.LOO == nil) != (g.LOO == nil) {
			t.Errorf("%s: depth %q ladder %d LOO %v, tuned %q %d %v", p, g.Depth, len(g.Ladder), g.LOO, r.Depth, len(r.Ladder), r.LOO)
		}
		if g.Params.Multiplier != r.Params.Multiplier {
			t.Errorf("%s: multiplier %g, tuned %g", p, g.Params.Multiplier, r.Params.Multiplier)
		}
	}
}

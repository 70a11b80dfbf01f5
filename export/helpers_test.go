package export

import (
	"path/filepath"
	"testing"

	"labmatch/fit"
	"labmatch/lab"
	"labmatch/samples"
)

// testReports are the reports every export is checked on: the demo reports, the published
// report and the good reader fixture of testdata.
var testReports = []string{"tr3-black", "tr7-light", "tr12-heavy", "good-oil-well-4", "basic"}

type tuned struct {
	r       *lab.Report
	ds      *fit.Dataset
	results map[fit.PropertyID]fit.Result
	m       *fit.Model
	src     Source
}

func loadTuned(t testing.TB, id string) tuned {
	t.Helper()
	var r *lab.Report
	var err error
	switch id {
	case "basic":
		r, err = lab.ReadFolder(filepath.Join("..", "testdata", "good", "basic"))
	case "good-oil-well-4": // the published report
		r, err = lab.ReadFolder(filepath.Join("..", "testdata", "published", "good-oil-well-4"))
	default:
		r, err = samples.Load(id)
	}
	if err != nil {
		t.Fatal(err)
	}
	ds, err := fit.NewDataset(r)
	if err != nil {
		t.Fatal(err)
	}
	opts := fit.Options{}
	res, err := fit.TuneAll(ds, nil, opts)
	if err != nil {
		t.Fatal(err)
	}
	m, err := fit.NewModel(ds, res, opts)
	if err != nil {
		t.Fatal(err)
	}
	return tuned{r: r, ds: ds, results: res, m: m, src: NewSource("labmatch test", ds.Name, r.Fingerprint, "tuned in the test", m, res)}
}

func buildTable(t testing.TB, tu tuned, opts TableOptions) *Table {
	t.Helper()
	if opts.MaxLabPressure == 0 {
		opts.MaxLabPressure = MaxLabPressure(tu.r)
	}
	tab, err := BuildTable(tu.m, tu.src, opts)
	if err != nil {
		t.Fatal(err)
	}
	return tab
}

func relDiff(a, b float64) float64 {
	if a == b {
		return 0
	}
	d := a - b
	if d < 0 {
		d = -d
	}
	s := b
	if s < 0 {
		s = -s
	}
	return d / s
}

package export

import (
	"io"
	"path/filepath"
	"testing"

	"labmatch/fit"
)

// saveBenchTuning writes a tuning file of a demo report and returns its path.
func saveBenchTuning(b *testing.B, id string) (string, tuned) {
	b.Helper()
	tu := loadTuned(b, id)
	path := filepath.Join(b.TempDir(), "tuning.json")
	if err := SaveTuning(path, NewTuningFile("labmatch bench", tu.r, tu.results, fit.Options{}, nil), false); err != nil {
		b.Fatal(err)
	}
	return path, tu
}

// BenchmarkTablesFromTuningFile: read a tuning file, build the model and a 50-row table with
// its branches, write the deck (the table benchmark).
func BenchmarkTablesFromTuningFile(b *testing.B) {
	path, _ := saveBenchTuning(b, "tr3-black")
	b.ReportAllocs()
	for b.Loop() {
		tf, err := LoadTuning(path)
		if err != nil {
			b.Fatal(err)
		}
		m, _, err := tf.Model()
		if err != nil {
			b.Fatal(err)
		}
		t, err := BuildTable(m, NewSource("bench", tf.Report, tf.Fingerprint, "", m, tf.Results()),
			TableOptions{Points: 50, Salinity: DefaultSalinity, MaxLabPressure: tf.Fluid.MaxLabPressure})
		if err != nil {
			b.Fatal(err)
		}
		if err := WriteDeck(io.Discard, t, Field); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkTableCSV50: the same table written as CSV (water evaluated at every row).
func BenchmarkTableCSV50(b *testing.B) {
	tu := loadTuned(b, "tr3-black")
	t := buildTable(b, tu, TableOptions{Points: 50, Salinity: DefaultSalinity})
	b.ReportAllocs()
	for b.Loop() {
		if err := WriteCSV(io.Discard, t, Metric); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkReportFromTuningFile: read a tuning file, apply it to its report (statistics,
// residuals), rank every family, draw the plots and write the HTML (the report
// benchmark).
func BenchmarkReportFromTuningFile(b *testing.B) {
	path, tu := saveBenchTuning(b, "tr3-black")
	b.ReportAllocs()
	for b.Loop() {
		tf, err := LoadTuning(path)
		if err != nil {
			b.Fatal(err)
		}
		opts := tf.FitOptions()
		res, err := fit.Apply(tu.ds, tf.Results(), opts)
		if err != nil {
			b.Fatal(err)
		}
		in := ReportInput{Tool: "bench", Report: tu.r, Dataset: tu.ds, Results: res, Options: opts, Generated: reportDate}
		if err := WriteReport(io.Discard, in); err != nil {
			b.Fatal(err)
		}
	}
}

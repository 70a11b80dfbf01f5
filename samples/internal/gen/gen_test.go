package main

import (
	"math"
	"os"
	"path/filepath"
	"testing"

	"labmatch/lab"
	"labmatch/samples/internal/spec"
)

// The committed demo reports are exactly what the generator makes (run `go generate
// ./samples` after changing it).
func TestDemoReportsAreReproducible(t *testing.T) {
	out := t.TempDir()
	for _, s := range spec.Specs {
		r, err := build(s)
		if err != nil {
			t.Fatal(err)
		}
		units := lab.FieldUnits()
		if s.Metric {
			units = lab.MetricUnits()
			roundIn(r, units)
		}
		dir := filepath.Join(out, s.ID)
		if err := lab.WriteFolder(dir, r, lab.WriteOptions{Units: units}); err != nil {
			t.Fatal(err)
		}
		ents, err := os.ReadDir(dir)
		if err != nil {
			t.Fatal(err)
		}
		for _, e := range ents {
			got, _ := os.ReadFile(filepath.Join(dir, e.Name()))
			want, err := os.ReadFile(filepath.Join("..", "..", "data", s.ID, e.Name()))
			if err != nil {
				t.Fatalf("%s/%s: %v (run go generate ./samples)", s.ID, e.Name(), err)
			}
			if string(got) != string(want) {
				t.Errorf("%s/%s differs from what the generator makes (run go generate ./samples)", s.ID, e.Name())
			}
		}
	}
}

// The DL numbers written turn back into the intended separator-basis values under the
// DL → separator adjustment (DESIGN.md §5): Rs and Bo at each stage match the generating
// family and multiplier within the noise and rounding.
func TestDemoDLAdjustsToIntendedValues(t *testing.T) {
	for _, s := range spec.Specs {
		r, err := lab.ReadFolder(filepath.Join("..", "..", "data", s.ID))
		if err != nil {
			t.Fatal(err)
		}
		sel, _ := r.SelectedSeparator()
		if sel.ID != "S2" {
			t.Errorf("%s: selected test %s, want S2 (the smallest Bofb)", s.ID, sel.ID)
		}
		tr, err := newTruth(s, sel.Stages[0].Pressure, sel.Stages[0].Temperature, sel.Stages[0].GasGravity)
		if err != nil {
			t.Fatal(err)
		}
		basis, err := r.SeparatorBasis()
		if err != nil {
			t.Fatal(err)
		}
		// Tolerances: 4 noise standard deviations plus the rounding of the printed values.
		tolRs := 4*s.Noise + 0.01
		tolBo := 4*s.Noise*0.5 + 2e-4
		for _, b := range basis.Below {
			rs, _ := tr.rs(b.Pressure)
			bo, _ := tr.boSat(b.Pressure, rs)
			if rs > 20 && math.Abs(b.Rs/rs-1) > tolRs {
				t.Errorf("%s: %g psia: adjusted Rs %.1f, intended %.1f", s.ID, b.Pressure, b.Rs, rs)
			}
			if math.Abs(b.Bo/bo-1) > tolBo {
				t.Errorf("%s: %g psia: adjusted Bo %.4f, intended %.4f", s.ID, b.Pressure, b.Bo, bo)
			}
		}
	}
}

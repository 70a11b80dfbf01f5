package lab

import (
	"errors"
	"path/filepath"
	"testing"
)

// The demo reports are clean: no finding above a note.
func TestDemoReportsClean(t *testing.T) {
	for _, id := range []string{"tr3-black", "tr7-light", "tr12-heavy"} {
		r, err := ReadFolder(filepath.Join("..", "samples", "data", id))
		if err != nil {
			t.Fatal(err)
		}
		for _, f := range Check(r) {
			if f.Severity > Note {
				t.Errorf("%s: %s %s:%d %s: %s", id, f.Severity, f.File, f.Row, f.Code, f.Message)
			}
		}
	}
}

// Each folder in testdata/mutated is the demo report tr3-black with one fault. The fault is
// named at its file and row, and nothing above a note is reported anywhere else.
func TestMutatedDemoReports(t *testing.T) {
	cases := []struct {
		dir      string
		file     string
		row      int
		code     string   // QC finding expected at file:row
		severity Severity // of that finding
		readErr  error    // or: the reader refuses the report
	}{
		// Rsd 128 typed as 218 at 762 psia.
		{dir: "swapped-digit", file: DLFile, row: 9, code: "dl-rs-rising", severity: Error},
		// The atmospheric stage (Rsd = 0) left out.
		{dir: "dropped-stage", file: DLFile, row: 11, code: "dl-last-rs-nonzero", severity: Warning},
		// Bofb of test S2 typed 1.4513 instead of 1.3513: above the DL's Bodb.
		{dir: "wrong-bofb", file: SeparatorFile, row: 6, code: "sep-bofb-above-bodb", severity: Warning},
		// V/Vsat at 2227 psia typed 1.1663 instead of 1.1363.
		{dir: "cce-outlier", file: CCEFile, row: 11, code: "cce-y-outlier", severity: Warning},
		// The saturation pressure labelled psig although it is the DL's psia value.
		{dir: "psig-slip", file: FluidFile, row: 5, readErr: ErrMismatch},
	}
	for _, c := range cases {
		t.Run(c.dir, func(t *testing.T) {
			r, err := ReadFolder(filepath.Join("..", "testdata", "mutated", c.dir))
			if c.readErr != nil {
				var pe *ParseError
				if !errors.As(err, &pe) || !errors.Is(err, c.readErr) || pe.File != c.file || pe.Line != c.row {
					t.Fatalf("read error %v, want %v at %s:%d", err, c.readErr, c.file, c.row)
				}
				if pe.Hint == "" {
					t.Errorf("no hint for a psig/psia slip: %v", err)
				}
				return
			}
			if err != nil {
				t.Fatal(err)
			}
			found := false
			for _, f := range Check(r) {
				if f.File == c.file && f.Row == c.row && f.Code == c.code && f.Severity == c.severity {
					found = true
					continue
				}
				if f.Severity > Note && (f.File != c.file || f.Row != c.row) {
					t.Errorf("spurious %s at %s:%d %s: %s", f.Severity, f.File, f.Row, f.Code, f.Message)
				}
			}
			if !found {
				t.Errorf("no %s %s at %s:%d", c.severity, c.code, c.file, c.row)
			}
		})
	}
}

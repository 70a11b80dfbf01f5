package lab

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"testing/fstest"
)

// A unit typed into a number cell gets the header hint; a typo does not.
func TestNumberHints(t *testing.T) {
	for _, c := range []struct {
		cell, hint string
	}{
		{"2930psia", "name [unit]"},
		{"93 degC", "name [unit]"},
		{"5x9", ""},
		{"12,5", "decimal separator"},
	} {
		_, pe := parseNumber(c.cell)
		if pe == nil {
			t.Fatalf("%q: want an error", c.cell)
		}
		if c.hint == "" && pe.Hint != "" || !strings.Contains(pe.Hint, c.hint) {
			t.Errorf("%q: hint %q, want %q", c.cell, pe.Hint, c.hint)
		}
	}
}

// Written files are readable by others (0644) and an existing file is never replaced
// without force.
func TestWriteFileAtomic(t *testing.T) {
	p := filepath.Join(t.TempDir(), "out.json")
	if err := WriteFileAtomic(p, []byte("one"), false); err != nil {
		t.Fatal(err)
	}
	if st, err := os.Stat(p); err != nil || st.Mode().Perm() != 0o644 {
		t.Errorf("mode %v (%v), want 0644", st.Mode().Perm(), err)
	}
	if err := WriteFileAtomic(p, []byte("two"), false); !errors.Is(err, fs.ErrExist) {
		t.Errorf("second write without force: %v, want fs.ErrExist", err)
	}
	if b, _ := os.ReadFile(p); string(b) != "one" {
		t.Errorf("file changed to %q", b)
	}
	if err := WriteFileAtomic(p, []byte("three"), true); err != nil {
		t.Fatal(err)
	}
	if b, _ := os.ReadFile(p); string(b) != "three" {
		t.Errorf("forced write gave %q", b)
	}
	ents, _ := os.ReadDir(filepath.Dir(p))
	if len(ents) != 1 {
		t.Errorf("temporary files left behind: %v", ents)
	}
}

// A one-atmosphere-ish gap between two absolute pressures is an ordinary spread, not a
// refused report: 2620 psia in fluid.csv and dl.csv, the CCE's V/Vsat = 1 at 2634.9 psia.
func TestNearAtmosphereGapLoads(t *testing.T) {
	fsys := fstest.MapFS{
		"r/fluid.csv": {Data: []byte("key,value,unit\nreservoir temperature,200,degF\nsaturation pressure,2620,psia\nstock-tank API,35,API\n")},
		"r/dl.csv":    {Data: []byte("pressure [psia],Rsd [scf/STB],Bod [rb/STB]\n2620,600,1.35\n1500,400,1.25\n14.7,0,1.05\n")},
		"r/cce.csv":   {Data: []byte("pressure [psia],relative volume\n4000,0.985\n2634.9,1\n2000,1.12\n")},
	}
	if _, err := ReadFS(fsys, "r"); err != nil {
		t.Fatalf("refused: %v", err)
	}
}

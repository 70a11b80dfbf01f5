package main

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"labmatch/fit"
	"labmatch/samples"
	"labmatch/tui"
)

func TestWorkbenchExporters(t *testing.T) {
	r, err := samples.Load("tr3-black")
	if err != nil {
		t.Fatal(err)
	}
	ds, err := fit.NewDataset(r)
	if err != nil {
		t.Fatal(err)
	}
	res, err := fit.TuneAll(ds, nil, fit.Options{})
	if err != nil {
		t.Fatal(err)
	}
	m, err := fit.NewModel(ds, res, fit.Options{})
	if err != nil {
		t.Fatal(err)
	}
	snap := tui.Snapshot{Tool: "labmatch test", Report: r, Dataset: ds, Results: res, Model: m}
	// The options are applied to a config the test cannot see; call the writers directly
	// through the same constructors.
	dir := t.TempDir()
	for _, c := range []struct {
		name, want string
		write      func(path string, force bool) error
	}{
		{"t.csv", "row,saturation pressure [psia]", func(p string, f bool) error { return exportTable(p, snap, "csv", f) }},
		{"t.inc", "PVTO", func(p string, f bool) error { return exportTable(p, snap, "deck", f) }},
		{"r.html", "<!DOCTYPE html>", func(p string, f bool) error { return exportReport(p, snap, f) }},
	} {
		path := filepath.Join(dir, c.name)
		if err := c.write(path, false); err != nil {
			t.Fatalf("%s: %v", c.name, err)
		}
		b, _ := os.ReadFile(path)
		if !strings.Contains(string(b), c.want) {
			t.Errorf("%s lacks %q", c.name, c.want)
		}
		if err := c.write(path, false); !errors.Is(err, fs.ErrExist) {
			t.Errorf("%s again without force: %v, want fs.ErrExist (the workbench then asks)", c.name, err)
		}
	}
	if n := len(workbenchExporters()); n != 3 {
		t.Errorf("%d exporters wired, want CSV, deck and HTML", n)
	}
}

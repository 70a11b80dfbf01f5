package main

import (
	"os/exec"
	"strings"
	"testing"
)

// The numerical packages never depend on the terminal UI (DESIGN.md §2).
func TestLayers(t *testing.T) {
	if _, err := exec.LookPath("go"); err != nil {
		t.Skip("go command not available")
	}
	out, err := exec.Command("go", "list", "-deps", "./correlations", "./lab", "./fit", "./export").CombinedOutput()
	if err != nil {
		t.Fatalf("go list: %v\n%s", err, out)
	}
	for _, dep := range strings.Fields(string(out)) {
		if strings.Contains(dep, "bubbletea") || strings.Contains(dep, "lipgloss") || strings.Contains(dep, "labmatch/tui") {
			t.Errorf("a numerical package depends on %s", dep)
		}
	}
	out, err = exec.Command("go", "list", "-deps", "./correlations").CombinedOutput()
	if err != nil {
		t.Fatalf("go list: %v\n%s", err, out)
	}
	for _, dep := range strings.Fields(string(out)) {
		if strings.HasPrefix(dep, "labmatch/") && dep != "labmatch/correlations" {
			t.Errorf("correlations depends on %s; it must stand alone", dep)
		}
	}
}

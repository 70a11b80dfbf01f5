package main

import (
	"strings"
	"testing"
)

// Scripts and CI run plain "labmatch" without a terminal: they get the summary, not the
// workbench; "open" says it needs a terminal.
func TestWorkbenchOnlyInATerminal(t *testing.T) {
	code, out, _ := runCLI(t)
	if code != exitOK || !strings.Contains(out, "Best family per property") {
		t.Errorf("labmatch without a terminal: exit %d, output %q", code, out)
	}
	code, _, errs := runCLI(t, "open", "demo:tr3-black")
	if code != exitUsage || !strings.Contains(errs, "needs a terminal") {
		t.Errorf("open without a terminal: exit %d, stderr %q", code, errs)
	}
	if code, _, _ := runCLI(t, "open"); code != exitUsage {
		t.Errorf("open without a folder: exit %d", code)
	}
}

package main

import (
	"encoding/json"
	"fmt"
	"io"

	"labmatch/lab"
)

func runCheck(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("check", "labmatch check DIR [--json]",
		"Load a report folder and list its QC findings, grouped by file, worst first.\nExit status 1 when the folder cannot be read or any finding is an error.")
	asJSON := fs.Bool("json", false, "print the findings as a JSON array")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) != 1 {
		return usageError(fs, stderr, "want one report folder, got %d arguments", len(pos))
	}
	r, err := lab.ReadFolder(pos[0])
	if err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	findings := lab.Check(r)
	if *asJSON {
		if findings == nil {
			findings = []lab.Finding{}
		}
		enc := json.NewEncoder(stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(findings); err != nil {
			fmt.Fprintln(stderr, "labmatch:", err)
			return exitData
		}
	} else {
		fmt.Fprintf(stdout, "%s: %s, %.0f degF, Pb %.0f psia, %.1f API\n", pos[0], r.Fluid.Sample, r.Fluid.Temperature, r.Fluid.Pb, r.Fluid.API)
		lab.FormatFindings(stdout, findings)
	}
	for _, f := range findings {
		if f.Severity == lab.Error {
			return exitData
		}
	}
	return exitOK
}

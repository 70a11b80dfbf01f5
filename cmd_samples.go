package main

import (
	"fmt"
	"io"
	"path/filepath"
	"text/tabwriter"

	"labmatch/lab"
	"labmatch/samples"
)

func runSamples(args []string, stdout, stderr io.Writer) int {
	fs := newFlagSet("samples", "labmatch samples [--out DIR] [--force]",
		"List the built-in demo reports (invented fluids of an invented field), or write each\nas a report folder DIR/<id> that the other commands can read.")
	out := fs.String("out", "", "write each demo report as a folder under `DIR`")
	force := fs.Bool("force", false, "overwrite files that already exist")
	pos, code := parseFlags(fs, args, stdout, stderr)
	if code >= 0 {
		return code
	}
	if len(pos) > 0 {
		return usageError(fs, stderr, "unexpected argument %q", pos[0])
	}
	if *out == "" {
		tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
		fmt.Fprintln(tw, "id\tdescription\tAPI\tRsb [scf/STB]\tPb [psia]\tT [degF]")
		for _, s := range samples.Specs {
			r, err := samples.Load(s.ID)
			if err != nil {
				fmt.Fprintln(stderr, "labmatch:", err)
				return exitData
			}
			rsb := 0.0
			if t, ok := r.SelectedSeparator(); ok {
				rsb = t.Rsfb()
			}
			fmt.Fprintf(tw, "%s\t%s\t%.1f\t%.0f\t%.0f\t%.0f\n", s.ID, s.Description, r.Fluid.API, rsb, r.Fluid.Pb, r.Fluid.Temperature)
		}
		tw.Flush()
		fmt.Fprintln(stdout, "\nWrite them out as folders with: labmatch samples --out DIR")
		return exitOK
	}
	for _, s := range samples.Specs {
		r, err := samples.Load(s.ID)
		if err != nil {
			fmt.Fprintln(stderr, "labmatch:", err)
			return exitData
		}
		units := lab.FieldUnits()
		if s.Metric {
			units = lab.MetricUnits()
		}
		dir := filepath.Join(*out, s.ID)
		if err := lab.WriteFolder(dir, r, lab.WriteOptions{Units: units, Force: *force}); err != nil {
			fmt.Fprintln(stderr, "labmatch:", err)
			return exitData
		}
		fmt.Fprintf(stdout, "wrote %s\n", dir)
	}
	return exitOK
}

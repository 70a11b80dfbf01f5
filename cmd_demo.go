package main

import (
	"fmt"
	"io"
	"text/tabwriter"

	"labmatch/fit"
	"labmatch/lab"
	"labmatch/samples"
)

// runDemo is plain "labmatch": the main job on the built-in demo report (check, convert,
// rank, tune) printed as a summary until the workbench lands.
func runDemo(stdout, stderr io.Writer) int {
	r, err := samples.Load(samples.Default)
	if err != nil {
		fmt.Fprintln(stderr, "labmatch:", err)
		return exitData
	}
	fmt.Fprintf(stdout, "labmatch %s — built-in demo report %q (invented data)\n\n", version, samples.Default)
	fmt.Fprintf(stdout, "sample: %s\nreservoir temperature %.0f degF, saturation pressure %.0f psia, stock-tank %.1f API\n",
		r.Fluid.Sample, r.Fluid.Temperature, r.Fluid.Pb, r.Fluid.API)
	fmt.Fprintf(stdout, "tables: %d DL stages, %d separator tests, %d CCE points, %d viscosities\n\n",
		len(r.DL), len(r.Separator), len(r.CCE), len(r.Viscosity))
	fmt.Fprintln(stdout, "Report checks")
	lab.FormatFindings(stdout, lab.Check(r))
	ds, err := fit.NewDataset(r)
	if err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	fmt.Fprintf(stdout, "\nSeparator basis: Rsb %.0f scf/STB, Bob %.4f rb/STB (selected separator test)\n", ds.Rsb, ds.Bob)
	results, err := fit.TuneAll(ds, nil, fit.Options{})
	if err != nil {
		fmt.Fprintln(stderr, err)
		return exitData
	}
	fmt.Fprintln(stdout, "\nBest family per property, tuned with one multiplier")
	tw := tabwriter.NewWriter(stdout, 0, 0, 2, ' ', 0)
	fmt.Fprintln(tw, "  property\tfamily\tpoints\tAARE published %\tAARE tuned %\tmultiplier\t95% interval")
	for _, p := range fit.Properties {
		res, ok := results[p]
		if !ok {
			continue
		}
		ci := "not determined"
		if c, ok := res.CI95["multiplier"]; ok {
			ci = fmt.Sprintf("[%.3f, %.3f]", c[0], c[1])
			if res.CIAssumed {
				ci += " assumed"
			}
		}
		fmt.Fprintf(tw, "  %s\t%s\t%d\t%.2f\t%.2f\t%.3f\t%s\n", p, res.Family, res.Tuned.Points,
			res.Published.AARE, res.Tuned.AARE, res.Params.Multiplier, ci)
	}
	tw.Flush()
	fmt.Fprintln(stdout, "  (\"assumed\": one point per parameter, so the interval rests on a typical lab uncertainty)")
	fmt.Fprintln(stdout, `
Next: "labmatch rank demo:tr3-black" scores every family; "labmatch tune demo:tr3-black"
shows the residuals; "labmatch samples --out DIR" writes the demo reports as folders.
The interactive workbench is coming in a later release.

Correlation results are estimates, valid only near the data they were fitted to. Check them
against the lab report and local practice; facility, well-control and reserves decisions rest
with qualified engineers and local regulations.`)
	return exitOK
}

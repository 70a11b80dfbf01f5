package main

import (
	"errors"

	"labmatch/export"
	"labmatch/tui"
)

// workbenchExporters wires the export package's writers into the workbench's Tables screen:
// the same writers as labmatch tables and report, with their defaults (field units, 30
// saturated pressures to the larger of 1.5·Pb and the highest lab pressure, 3 wt % water).
func workbenchExporters() []tui.Option {
	table := func(f export.Format) tui.ExporterFunc {
		return func(path string, s tui.Snapshot, force bool) error { return exportTable(path, s, f, force) }
	}
	return []tui.Option{
		tui.WithExporter(tui.ExportTablesCSV, table(export.CSV)),
		tui.WithExporter(tui.ExportDeck, table(export.Deck)),
		tui.WithExporter(tui.ExportHTML, tui.ExporterFunc(exportReport)),
	}
}

// exportTable writes the workbench's tables in format f.
func exportTable(path string, s tui.Snapshot, f export.Format, force bool) error {
	t, err := snapshotTable(s)
	if err != nil {
		return err
	}
	return export.SaveTable(path, t, f, export.Field, force)
}

// exportReport writes the workbench's HTML report.
func exportReport(path string, s tui.Snapshot, force bool) error {
	if s.Report == nil || s.Dataset == nil || len(s.Results) == 0 {
		return errors.New("labmatch: no tuned report to write")
	}
	return export.SaveReport(path, export.ReportInput{Tool: s.Tool, Report: s.Report, Dataset: s.Dataset, Results: s.Results,
		Options: s.Options, Model: s.Model, Origin: "tuned in the workbench"}, force)
}

// snapshotTable is the black-oil table the Tables screen shows, or, before the screen has
// built one, the table of the workbench's tuned model with the same defaults.
func snapshotTable(s tui.Snapshot) (*export.Table, error) {
	if s.Table != nil {
		return s.Table, nil
	}
	if s.Model == nil || s.Report == nil || s.Dataset == nil {
		return nil, errors.New("labmatch: no tuned model to tabulate")
	}
	src := export.NewSource(s.Tool, s.Dataset.Name, s.Report.Fingerprint, "tuned in the workbench", s.Model, s.Results)
	return export.BuildTable(s.Model, src, export.TableOptions{MaxLabPressure: export.MaxLabPressure(s.Report), Salinity: export.DefaultSalinity})
}

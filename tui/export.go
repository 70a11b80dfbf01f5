package tui

import (
	"fmt"
	"path/filepath"
	"strings"

	"labmatch/export"
	"labmatch/fit"
	"labmatch/lab"
)

// ExportKind names a file that the Tables screen can write.
type ExportKind int

// The files the workbench can write. Only the tuning file has a writer in the export package
// today; the others are wired in through WithExporter when their writers exist.
const (
	ExportTuning    ExportKind = iota // the tuning file (JSON)
	ExportTablesCSV                   // black-oil tables as CSV
	ExportDeck                        // simulator include file (PROPS keywords)
	ExportHTML                        // self-contained HTML report
)

// exportKinds lists the kinds in the order the Tables screen shows them.
var exportKinds = []ExportKind{ExportTuning, ExportTablesCSV, ExportDeck, ExportHTML}

func (k ExportKind) String() string {
	switch k {
	case ExportTuning:
		return "tuning file"
	case ExportTablesCSV:
		return "tables (CSV)"
	case ExportDeck:
		return "simulator deck"
	case ExportHTML:
		return "HTML report"
	}
	return "file"
}

// suffix is the default file-name ending of the kind.
func (k ExportKind) suffix() string {
	switch k {
	case ExportTuning:
		return "-tuning.json"
	case ExportTablesCSV:
		return "-tables.csv"
	case ExportDeck:
		return "-props.inc"
	case ExportHTML:
		return "-report.html"
	}
	return ".out"
}

// Snapshot is the session at the moment a file is saved: what an exporter writes from. The
// maps are copies; an exporter may keep them.
type Snapshot struct {
	Tool    string // "labmatch 0.1.0"
	Report  *lab.Report
	Dataset *fit.Dataset
	Results map[fit.PropertyID]fit.Result
	Options fit.Options // loss and excluded points as tuned
	Model   *fit.Model  // the tuned model built from Results; nil when it could not be built
	// Table is the black-oil table the Tables screen shows (export.BuildTable of Model with
	// the export package's default grid and salinity); nil when it could not be built. A
	// table exporter that writes it writes what the screen shows.
	Table *export.Table
}

// Exporter writes one kind of file from a snapshot. It must write atomically and keep an
// existing file unless force is set, returning an error that wraps fs.ErrExist then
// (lab.WriteFileAtomic does both), so that the workbench can ask before overwriting.
type Exporter interface {
	Export(path string, s Snapshot, force bool) error
}

// ExporterFunc adapts a function to Exporter.
type ExporterFunc func(path string, s Snapshot, force bool) error

// Export calls f.
func (f ExporterFunc) Export(path string, s Snapshot, force bool) error { return f(path, s, force) }

// TuningExporter writes the tuning file with export.SaveTuning.
var TuningExporter = ExporterFunc(func(path string, s Snapshot, force bool) error {
	if s.Report == nil {
		return fmt.Errorf("no report loaded")
	}
	var notes []string
	if s.Dataset != nil {
		notes = s.Dataset.Notes
	}
	tf := export.NewTuningFile(s.Tool, s.Report, s.Results, s.Options, notes)
	return export.SaveTuning(path, tf, force)
})

// defaultPath proposes a file name for a save: beside the report folder's name (in the
// current folder), from the sample id or the folder name.
func defaultPath(src string, r *lab.Report, k ExportKind) string {
	base := ""
	if r != nil && r.Dir != "" {
		base = filepath.Base(filepath.Clean(r.Dir))
	}
	if base == "" || base == "." || base == string(filepath.Separator) {
		base = strings.TrimPrefix(src, "demo:")
	}
	base = strings.Map(func(r rune) rune {
		switch {
		case r >= 'a' && r <= 'z', r >= 'A' && r <= 'Z', r >= '0' && r <= '9', r == '-', r == '_', r == '.':
			return r
		}
		return '-'
	}, base)
	if base == "" {
		base = "labmatch"
	}
	return base + k.suffix()
}

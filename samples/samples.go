// Package samples holds the built-in demo reports: three invented fluids from an invented
// field (see README.md in this folder). They are made by the generator in internal/gen from
// the project's own correlations; run `go generate ./samples` to remake them.
package samples

//go:generate go run ./internal/gen -out data

import (
	"embed"
	"fmt"
	"io/fs"

	"labmatch/lab"
)

//go:embed data
var data embed.FS

// Default is the id of the report the workbench opens with no arguments.
const Default = "tr3-black"

// FS returns the folder tree of the demo reports: one folder per id.
func FS() fs.FS {
	sub, err := fs.Sub(data, "data")
	if err != nil {
		panic(err) // the embedded tree is fixed at build time
	}
	return sub
}

// Load reads the demo report with the given id.
func Load(id string) (*lab.Report, error) {
	for _, s := range Specs {
		if s.ID == id {
			r, err := lab.ReadFS(FS(), id)
			if err != nil {
				return nil, fmt.Errorf("samples: %s: %w", id, err)
			}
			return r, nil
		}
	}
	return nil, fmt.Errorf("samples: no demo report %q (have %s)", id, ids())
}

func ids() string {
	s := ""
	for i, sp := range Specs {
		if i > 0 {
			s += ", "
		}
		s += sp.ID
	}
	return s
}

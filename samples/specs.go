package samples

import "labmatch/samples/internal/spec"

// Spec describes how one demo report is made (families, multipliers, noise).
type Spec = spec.Spec

// Specs are the demo reports, in the order they are listed.
var Specs = spec.Specs

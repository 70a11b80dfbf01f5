// Package correlations holds the published black-oil and natural-gas correlations as pure
// functions of field-unit inputs, and a read-only catalog that describes each of them.
//
// Units everywhere in this package: pressure psia, temperature °F, solution gas-oil ratio
// scf/STB, oil formation volume factor rb/STB, viscosity cP, density lbm/ft³, oil gravity °API,
// gas gravity relative to air = 1, compressibility 1/psi.
//
// Every function returns a finite value or an error. Inputs outside the range of the data a
// correlation was fitted to are not refused (extrapolation is allowed); Entry.Check reports
// them so that the caller can flag them.
package correlations

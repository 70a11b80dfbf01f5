// Package export writes what labmatch produces: the tuning file (JSON) that records the chosen
// families, their tuned parameters and the fluid description; black-oil tables from the tuned
// model as CSV or as an include file for the PROPS section of a black-oil simulation deck
// (PVTO, PVDG, PVTW, DENSITY) checked against the rules the simulator enforces; and a
// self-contained HTML report with SVG plots. Every file is written atomically.
package export

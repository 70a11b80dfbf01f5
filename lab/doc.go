// Package lab holds the laboratory PVT report model, reads and writes report folders with
// unit-aware CSV headers, converts units at the edge, checks a report for consistency and
// adjusts differential-liberation data to separator conditions.
//
// A report folder holds plain CSV files (comma-separated, UTF-8, optional BOM, '#' comment
// lines, blank lines ignored). Only fluid.csv and dl.csv are required. Header cells are
// "name [unit]"; names are case-insensitive and synonyms are accepted. Empty cells beyond
// the header are a spreadsheet's padding only when the header or every row is padded as far;
// a single longer row is refused, as it is most likely a number written with a decimal comma
// in front of an empty optional column. See DESIGN.md §3.
package lab

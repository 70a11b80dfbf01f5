package export

import (
	"bytes"
	"fmt"

	"labmatch/lab"
)

// Format is the layout of a table file.
type Format string

// Table formats.
const (
	CSV  Format = "csv"  // one CSV file with "name [unit]" headers
	Deck Format = "deck" // an include file for the PROPS section of a black-oil deck
)

// ParseFormat reads "csv" or "deck".
func ParseFormat(s string) (Format, error) {
	switch Format(s) {
	case CSV, Deck:
		return Format(s), nil
	}
	return "", fmt.Errorf("export: format %q: want csv or deck", s)
}

// RenderTable returns the table in format f and units u.
func RenderTable(t *Table, f Format, u Units) ([]byte, error) {
	var b bytes.Buffer
	var err error
	switch f {
	case CSV:
		err = WriteCSV(&b, t, u)
	case Deck:
		err = WriteDeck(&b, t, u)
	default:
		err = fmt.Errorf("export: format %q: want csv or deck", f)
	}
	if err != nil {
		return nil, err
	}
	return b.Bytes(), nil
}

// SaveTable writes the table to path atomically (a temporary file, then a rename): a failure
// leaves an existing file as it was, and an existing file is kept unless force is set.
func SaveTable(path string, t *Table, f Format, u Units, force bool) error {
	data, err := RenderTable(t, f, u)
	if err != nil {
		return err
	}
	return lab.WriteFileAtomic(path, data, force)
}

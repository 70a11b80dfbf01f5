package main

import (
	"bytes"
	"os"
	"testing"
)

// The committed demo survey is exactly what the generator makes (run `go generate ./samples`
// after changing it).
func TestDemoSurveyIsReproducible(t *testing.T) {
	got, err := build()
	if err != nil {
		t.Fatal(err)
	}
	want, err := os.ReadFile("../../survey/tamsin-ridge.csv")
	if err != nil {
		t.Fatalf("%v (run go generate ./samples)", err)
	}
	if !bytes.Equal(got, want) {
		t.Error("samples/survey/tamsin-ridge.csv differs from the generator's output: run go generate ./samples")
	}
}

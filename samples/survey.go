package samples

//go:generate go run ./internal/gensurvey -out survey/tamsin-ridge.csv

import (
	_ "embed"
	"fmt"
	"strings"

	"labmatch/lab"
)

// SurveyID is the name of the built-in demo survey: "labmatch survey demo:tamsin-ridge".
const SurveyID = "tamsin-ridge"

//go:embed survey/tamsin-ridge.csv
var surveyData []byte

// SurveyData returns the bytes of the demo survey file: invented samples of the invented
// Tamsin Ridge field (see README.md in this folder).
func SurveyData() []byte { return append([]byte(nil), surveyData...) }

// LoadSurvey reads the demo survey with the given id.
func LoadSurvey(id string) (*lab.Survey, error) {
	if id != SurveyID {
		return nil, fmt.Errorf("samples: no demo survey %q (have %s)", id, SurveyID)
	}
	return lab.ParseSurvey("demo:"+strings.TrimSpace(id), surveyData)
}

package lab

// Severity grades a QC finding.
type Severity int

// Severities, worst last so that they sort.
const (
	Note Severity = iota
	Warning
	Error
)

func (s Severity) String() string {
	switch s {
	case Error:
		return "error"
	case Warning:
		return "warning"
	}
	return "note"
}

// MarshalText writes the severity as its name in JSON.
func (s Severity) MarshalText() ([]byte, error) { return []byte(s.String()), nil }

// Finding is one QC observation about a report: suspicious but loadable data. Errors in the
// sense of unreadable input are returned as *ParseError instead.
type Finding struct {
	Severity Severity `json:"severity"`
	File     string   `json:"file"`    // "dl.csv", "fluid.csv", … or "" for the whole report
	Row      int      `json:"row"`     // line in File, 0 when it concerns the whole file
	Code     string   `json:"code"`    // stable short id, e.g. "dl-rs-not-falling"
	Message  string   `json:"message"` // what is wrong, with the numbers involved
	Action   string   `json:"action"`  // what to do about it
}

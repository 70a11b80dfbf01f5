// Package export writes what labmatch produces: the tuning file (JSON) that records the chosen
// families and their tuned parameters, and reads it back.
package export

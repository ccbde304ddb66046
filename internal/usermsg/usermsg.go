// Package usermsg turns the text of a library error into what a user reads: the packages of
// n2pulse prefix their errors with their name ("study: ", "units: "), which says where the
// error arose but nothing a user can act on, so the command line and the status column of a
// sweep table drop those prefixes and keep the key, the file and the reason.
package usermsg

import "strings"

// Prefixes are the package prefixes removed.
var Prefixes = []string{"study: ", "units: ", "design: ", "kinetics: ", "swarm: ", "spectro: ",
	"validation: ", "plots: ", "ode: "}

// Strip removes the package prefixes from msg wherever they stand in a chain of wrapped
// messages: "study: point 3: design: gas.pressure …" becomes "point 3: gas.pressure …".
func Strip(msg string) string {
	for changed := true; changed; {
		changed = false
		for _, p := range Prefixes {
			if m := strings.ReplaceAll(strings.TrimPrefix(msg, p), ": "+p, ": "); m != msg {
				msg, changed = m, true
			}
		}
	}
	return msg
}

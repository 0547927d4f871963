package scenario

// BadInputs exposes the bad-input table to the external tests of this
// folder (checkrun_test.go), as name, text and expected message piece.
func BadInputs() [][3]string {
	var out [][3]string
	for _, c := range badInputs() {
		out = append(out, [3]string{c.name, c.text, c.want})
	}
	return out
}

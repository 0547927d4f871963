package suggest

import "strings"

// Hint returns ` (did you mean "K"?)` for the allowed name K closest
// to a misspelt name, or "" when none is close: a name that extends it by a
// unit or suffix ("half_angle" → "half_angle_deg"), one it extends
// ("tilt_degrees" → "tilt_deg"), or one within a small
// edit distance (Levenshtein: insertions, deletions, substitutions; at most
// 1 for names of up to 4 letters, 2 above). A name that differs only in
// case is suggested in its right case.
// Several equally close names give no suggestion, since a guess between
// them could mislead.
func Hint(name string, allowed []string) string {
	if best := Closest(name, allowed); best != "" {
		return ` (did you mean "` + best + `"?)`
	}
	return ""
}

// Closest returns the allowed name Hint suggests for a misspelt name, or "".
func Closest(name string, allowed []string) string {
	n := strings.ToLower(name)
	if n == "" {
		return ""
	}
	var best string
	bestD, ties := 1<<30, 0
	for _, a := range allowed {
		l := strings.ToLower(a)
		d := editDistance(n, l)
		if d > 0 && (strings.HasPrefix(l, n+"_") || len(l) >= 4 && strings.HasPrefix(n, l)) {
			d = min(d, 1) // a unit suffix missing or spelt out: "altitude", "tilt_degrees"
		}
		switch {
		case d < bestD:
			best, bestD, ties = a, d, 1
		case d == bestD:
			ties++
		}
	}
	limit := 2
	if len([]rune(n)) <= 4 {
		limit = 1
	}
	if bestD > limit || ties > 1 || best == name {
		return ""
	}
	return best
}

// editDistance is the Levenshtein distance between a and b, in runes.
func editDistance(a, b string) int {
	ra, rb := []rune(a), []rune(b)
	prev := make([]int, len(rb)+1)
	cur := make([]int, len(rb)+1)
	for j := range prev {
		prev[j] = j
	}
	for i := 1; i <= len(ra); i++ {
		cur[0] = i
		for j := 1; j <= len(rb); j++ {
			cost := 1
			if ra[i-1] == rb[j-1] {
				cost = 0
			}
			cur[j] = min(prev[j]+1, cur[j-1]+1, prev[j-1]+cost)
		}
		prev, cur = cur, prev
	}
	return prev[len(rb)]
}

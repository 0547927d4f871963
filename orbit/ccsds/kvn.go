package ccsds

import (
	"bufio"
	"fmt"
	"io"
	"strings"
	"time"
)

// MaxFileBytes bounds an ephemeris or attitude file read (64 MiB).
const MaxFileBytes = 64 << 20

// line is one non-blank, non-comment line of a KVN file with its number.
type line struct {
	n    int
	text string
}

// kvnLines splits a KVN file into lines, dropping blank and COMMENT lines.
func kvnLines(r io.Reader) ([]line, error) {
	sc := bufio.NewScanner(io.LimitReader(r, MaxFileBytes+1))
	sc.Buffer(make([]byte, 64<<10), 1<<20)
	var out []line
	total := 0
	for n := 1; sc.Scan(); n++ {
		total += len(sc.Bytes()) + 1
		if total > MaxFileBytes {
			return nil, fmt.Errorf("file is larger than %d MiB; allowed smaller files", MaxFileBytes>>20)
		}
		t := strings.TrimSpace(sc.Text())
		if t == "" || t == "COMMENT" || strings.HasPrefix(t, "COMMENT ") {
			continue
		}
		out = append(out, line{n, t})
	}
	if err := sc.Err(); err != nil {
		return nil, err
	}
	return out, nil
}

// keyValue splits "KEY = value".
func keyValue(t string) (key, value string, ok bool) {
	i := strings.IndexByte(t, '=')
	if i < 0 {
		return "", "", false
	}
	return strings.TrimSpace(t[:i]), strings.TrimSpace(t[i+1:]), true
}

// parseEpoch reads a CCSDS epoch in calendar form YYYY-MM-DDThh:mm:ss[.d…]
// or day-of-year form YYYY-DDDThh:mm:ss[.d…] (CCSDS 502.0-B-2 §7.5.10),
// with an optional trailing Z.
func parseEpoch(s string) (time.Time, error) {
	s = strings.TrimSuffix(s, "Z")
	for _, layout := range []string{"2006-01-02T15:04:05.999999999", "2006-002T15:04:05.999999999"} {
		if t, err := time.Parse(layout, s); err == nil {
			return t.UTC(), nil
		}
	}
	return time.Time{}, fmt.Errorf("epoch %q is not YYYY-MM-DDThh:mm:ss or YYYY-DDDThh:mm:ss", s)
}

// formatEpoch writes a UTC epoch in calendar form with microseconds.
func formatEpoch(t time.Time) string {
	return t.UTC().Format("2006-01-02T15:04:05.000000")
}

// errAt names the line of a parse error.
func errAt(kind string, l line, format string, a ...any) error {
	return fmt.Errorf("ccsds: %s line %d: %s", kind, l.n, fmt.Sprintf(format, a...))
}

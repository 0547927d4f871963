package scenario

import (
	"errors"
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// Span is a length of time written in Go's duration syntax ("90m", "1h30m",
// "10s") extended with two mixable units: d = 24 h and w = 7 d ("1d12h", "30d",
// "2w"). Years and months are refused because their length depends on the
// calendar. The zero Span is "0s".
type Span time.Duration

const (
	day  = 24 * time.Hour
	week = 7 * day
)

// Duration returns the span as a time.Duration.
func (s Span) Duration() time.Duration { return time.Duration(s) }

// Seconds returns the span in seconds.
func (s Span) Seconds() float64 { return time.Duration(s).Seconds() }

// ParseSpan reads a span such as "1d12h", "30d", "90m" or "0.5s".
func ParseSpan(text string) (Span, error) {
	s := strings.TrimSpace(text)
	if s == "" {
		return 0, errors.New("is empty; allowed a length of time such as 90m, 1d12h or 30d")
	}
	neg := false
	if s[0] == '-' || s[0] == '+' {
		neg = s[0] == '-'
		s = s[1:]
	}
	if s == "0" {
		return 0, nil
	}
	if s == "" {
		return 0, fmt.Errorf("%q has no number; allowed a length of time such as 90m, 1d12h or 30d", text)
	}
	var total time.Duration
	var goPart strings.Builder
	for s != "" {
		i := 0
		for i < len(s) && (s[i] == '.' || (s[i] >= '0' && s[i] <= '9')) {
			i++
		}
		if i == 0 {
			return 0, fmt.Errorf("%q: expected a number before %q; allowed a length of time such as 90m, 1d12h or 30d", text, s)
		}
		num := s[:i]
		s = s[i:]
		j := 0
		for j < len(s) && s[j] != '.' && (s[j] < '0' || s[j] > '9') {
			j++
		}
		unit := s[:j]
		s = s[j:]
		switch unit {
		case "d", "w":
			f, err := strconv.ParseFloat(num, 64)
			if err != nil {
				return 0, fmt.Errorf("%q: %q is not a number", text, num)
			}
			per := day
			if unit == "w" {
				per = week
			}
			ns := f * float64(per)
			if ns > math.MaxInt64/2 || math.IsNaN(ns) {
				return 0, fmt.Errorf("%q is too long; allowed up to about 146 years", text)
			}
			total += time.Duration(math.Round(ns))
		case "ns", "us", "µs", "μs", "ms", "s", "m", "h":
			goPart.WriteString(num + unit)
		case "":
			return 0, fmt.Errorf("%q: number %s has no unit; allowed units ns, us, ms, s, m, h, d, w", text, num)
		case "y", "yr", "year", "years", "mo", "month", "months", "M":
			return 0, fmt.Errorf("%q: unit %q is calendar-ambiguous; allowed units ns, us, ms, s, m, h, d (24 h), w (7 d)", text, unit)
		default:
			return 0, fmt.Errorf("%q: unknown unit %q; allowed units ns, us, ms, s, m, h, d (24 h), w (7 d)", text, unit)
		}
		if total > math.MaxInt64/2 {
			return 0, fmt.Errorf("%q is too long; allowed up to about 146 years", text)
		}
	}
	if goPart.Len() > 0 {
		d, err := time.ParseDuration(goPart.String())
		if err != nil || d > math.MaxInt64/2 {
			return 0, fmt.Errorf("%q is not a valid length of time; allowed such as 90m, 1d12h or 30d", text)
		}
		total += d
	}
	if neg {
		total = -total
	}
	return Span(total), nil
}

// String prints the span canonically: days, hours, minutes and seconds, with
// zero parts left out ("1d12h", "30d", "1h30m", "0.25s", "0s"). ParseSpan reads
// it back exactly.
func (s Span) String() string {
	d := time.Duration(s)
	if d == 0 {
		return "0s"
	}
	var b strings.Builder
	u := uint64(d)
	if d < 0 {
		b.WriteByte('-')
		u = -u
	}
	days := u / uint64(day)
	u %= uint64(day)
	hours := u / uint64(time.Hour)
	u %= uint64(time.Hour)
	mins := u / uint64(time.Minute)
	u %= uint64(time.Minute)
	secs := u / uint64(time.Second)
	frac := u % uint64(time.Second)
	if days > 0 {
		b.WriteString(strconv.FormatUint(days, 10) + "d")
	}
	if hours > 0 {
		b.WriteString(strconv.FormatUint(hours, 10) + "h")
	}
	if mins > 0 {
		b.WriteString(strconv.FormatUint(mins, 10) + "m")
	}
	if secs > 0 || frac > 0 {
		b.WriteString(strconv.FormatUint(secs, 10))
		if frac > 0 {
			f := fmt.Sprintf("%09d", frac)
			b.WriteString("." + strings.TrimRight(f, "0"))
		}
		b.WriteString("s")
	}
	return b.String()
}

// UnmarshalText implements encoding.TextUnmarshaler.
func (s *Span) UnmarshalText(text []byte) error {
	v, err := ParseSpan(string(text))
	if err != nil {
		return err
	}
	*s = v
	return nil
}

// MarshalText implements encoding.TextMarshaler.
func (s Span) MarshalText() ([]byte, error) { return []byte(s.String()), nil }

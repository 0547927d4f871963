package scenario

import (
	"fmt"
	"math"
	"strconv"
	"strings"
	"time"
)

// ParseLocalTime reads a local solar time of day, such as the local time of
// the ascending node (LTAN), and returns it in hours in [0, 24). It accepts
// "HH:MM" or "HH:MM:SS" ("10:30", "06:00:00"), hours with an h suffix
// ("10.5h") and an hour angle in degrees with a deg suffix ("157.5deg",
// 15° per hour).
func ParseLocalTime(text string) (float64, error) {
	s := strings.TrimSpace(text)
	allowed := "allowed a time of day in [00:00, 24:00) such as 10:30, 10.5h or 157.5deg"
	var h float64
	switch {
	case strings.Contains(s, ":"):
		parts := strings.Split(s, ":")
		if len(parts) > 3 {
			return 0, fmt.Errorf("%q has too many fields; %s", text, allowed)
		}
		limits := []float64{math.Inf(1), 60, 60}
		scale := []float64{1, 60, 3600}
		for i, p := range parts {
			if p == "" || strings.ContainsAny(p, "+-eEnNiI_xXpP") {
				return 0, fmt.Errorf("%q is not a time of day; %s", text, allowed)
			}
			v, err := strconv.ParseFloat(p, 64)
			if err != nil || v >= limits[i] || (i < len(parts)-1 && v != math.Trunc(v)) {
				return 0, fmt.Errorf("%q is not a time of day; %s", text, allowed)
			}
			h += v / scale[i]
		}
	case strings.HasSuffix(s, "deg"):
		v, err := parseFinite(strings.TrimSuffix(s, "deg"))
		if err != nil {
			return 0, fmt.Errorf("%q is not an angle in degrees; %s", text, allowed)
		}
		h = v / 15 // 15° of hour angle per hour
	case strings.HasSuffix(s, "h"):
		v, err := parseFinite(strings.TrimSuffix(s, "h"))
		if err != nil {
			return 0, fmt.Errorf("%q is not a number of hours; %s", text, allowed)
		}
		h = v
	default:
		return 0, fmt.Errorf("%q has no unit; %s", text, allowed)
	}
	if !(h >= 0 && h < 24) {
		return 0, fmt.Errorf("%q is out of range; %s", text, allowed)
	}
	return h, nil
}

// FormatLocalTime prints hours in [0, 24) as "HH:MM" or "HH:MM:SS".
func FormatLocalTime(hours float64) string {
	sec := int(math.Round(hours * 3600))
	if sec%60 == 0 {
		return fmt.Sprintf("%02d:%02d", sec/3600, sec/60%60)
	}
	return fmt.Sprintf("%02d:%02d:%02d", sec/3600, sec/60%60, sec%60)
}

func parseFinite(s string) (float64, error) {
	v, err := strconv.ParseFloat(strings.TrimSpace(s), 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return 0, fmt.Errorf("not a finite number")
	}
	return v, nil
}

// ParseEpoch reads an RFC 3339 time in UTC ("2026-03-20T12:00:00Z"). Offsets
// other than Z or +00:00 are refused so that no reader has to guess a zone.
func ParseEpoch(text string) (time.Time, error) {
	s := strings.TrimSpace(text)
	t, err := time.Parse(time.RFC3339Nano, s)
	if err != nil {
		return time.Time{}, fmt.Errorf("%q is not an RFC 3339 time; allowed UTC such as 2026-03-20T12:00:00Z", text)
	}
	if _, off := t.Zone(); off != 0 {
		return time.Time{}, fmt.Errorf("%q is not in UTC; allowed UTC with a trailing Z such as 2026-03-20T12:00:00Z", text)
	}
	return t.UTC(), nil
}

package logbook

import (
	"fmt"
	"math"
	"strconv"
	"strings"
)

// fmtFloat writes the shortest text that reads back to the same float64:
// plain decimals (2460000.4321, 0.0005), an exponent only for the very
// small or very large (1e-300), as encoding/json writes numbers.
func fmtFloat(v float64) string {
	if a := math.Abs(v); a != 0 && (a < 1e-6 || a >= 1e21) {
		return strconv.FormatFloat(v, 'e', -1, 64)
	}
	return strconv.FormatFloat(v, 'f', -1, 64)
}

// optFloat writes v, or an empty cell when v is NaN (missing).
func optFloat(v float64) string {
	if math.IsNaN(v) {
		return ""
	}
	return fmtFloat(v)
}

// zeroFloat writes v, or an empty cell when v is 0 or NaN (unknown in the
// Go type's own convention).
func zeroFloat(v float64) string {
	if v == 0 || math.IsNaN(v) {
		return ""
	}
	return fmtFloat(v)
}

// parseFinite reads a finite number.
func parseFinite(s string) (float64, error) {
	s = strings.TrimSpace(s)
	v, err := strconv.ParseFloat(s, 64)
	if err != nil || math.IsNaN(v) || math.IsInf(v, 0) {
		return math.NaN(), fmt.Errorf("%q is not a number", s)
	}
	return v, nil
}

// parseBool reads true/false (also yes/no, 1/0; any case); empty is false.
func parseBool(s string) (bool, error) {
	switch strings.ToLower(strings.TrimSpace(s)) {
	case "", "false", "no", "n", "0", "f":
		return false, nil
	case "true", "yes", "y", "1", "t":
		return true, nil
	}
	return false, fmt.Errorf("%q: want true or false", s)
}

// formatRaw writes comparison stars' instrumental magnitudes in the
// measurements table's cell format, "ID=mag/err; ID=mag" (the error left
// out when not known), every number exactly.
func formatRaw(ms []RawMag) string {
	parts := make([]string, len(ms))
	for i, m := range ms {
		parts[i] = m.Label + "=" + fmtFloat(m.InstMag)
		if !math.IsNaN(m.InstErr) {
			parts[i] += "/" + fmtFloat(m.InstErr)
		}
	}
	return strings.Join(parts, "; ")
}

// parseRaw reads the cell format formatRaw writes; an empty cell gives none.
func parseRaw(s string) ([]RawMag, error) {
	if strings.TrimSpace(s) == "" {
		return nil, nil
	}
	var out []RawMag
	for _, item := range strings.Split(s, ";") {
		item = strings.TrimSpace(item)
		if item == "" {
			continue
		}
		label, mags, ok := strings.Cut(item, "=")
		label = strings.TrimSpace(label)
		if !ok || label == "" {
			return nil, fmt.Errorf("comparison star %q: want ID=instrumental magnitude or ID=magnitude/error, e.g. C1=-8.123/0.004", item)
		}
		m := RawMag{Label: label, InstErr: math.NaN()}
		mag, e, hasErr := strings.Cut(mags, "/")
		var err error
		if m.InstMag, err = parseFinite(mag); err != nil {
			return nil, fmt.Errorf("comparison star %q: instrumental magnitude %w", label, err)
		}
		if hasErr {
			if m.InstErr, err = parseFinite(e); err != nil {
				return nil, fmt.Errorf("comparison star %q: error %w", label, err)
			}
		}
		out = append(out, m)
	}
	return out, nil
}

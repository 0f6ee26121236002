package dataset

import (
	"math"
	"strconv"
	"strings"
	"testing"
)

// plainYearGeneral is plainYear without its four-digit shortcut.
func plainYearGeneral(text string) (int, bool) {
	s := strings.TrimSpace(text)
	y, err := strconv.Atoi(s)
	if err != nil {
		if f, ferr := strconv.ParseFloat(s, 64); ferr == nil && f == math.Trunc(f) && math.Abs(f) < 1e6 {
			y, err = int(f), nil
		}
	}
	if err != nil || y < MinYear || y > MaxYear {
		return 0, false
	}
	return y, true
}

// TestPlainYearShortcut: every four-character digit string, and the
// usual other spellings, read as the general reading reads them.
func TestPlainYearShortcut(t *testing.T) {
	texts := []string{"", " 2020", "2020 ", "2020.0", "+2020", "-2020", "20200", "202", "2e3", "0x7E4", "١٢٣٤"}
	for y := 0; y <= 9999; y++ {
		texts = append(texts, strconv.Itoa(y), strconv.Itoa(y + 10000)[1:])
	}
	for _, s := range texts {
		gy, gok := plainYear(s)
		wy, wok := plainYearGeneral(s)
		if gy != wy || gok != wok {
			t.Fatalf("plainYear(%q) = %d, %v; the general reading gives %d, %v", s, gy, gok, wy, wok)
		}
	}
}

package format

import "testing"

func TestCapitalise(t *testing.T) {
	for in, want := range map[string]string{"papers summed": "Papers summed", "éluard": "Éluard", "Already": "Already", "": ""} {
		if got := Capitalise(in); got != want {
			t.Errorf("Capitalise(%q) = %q, want %q", in, got, want)
		}
	}
}

// Binary multiples: 1 KiB = 1,024 bytes, 1 MiB = 1,048,576 bytes (IEC
// 80000-13, from memory).
func TestBytes(t *testing.T) {
	for n, want := range map[int]string{812: "812 bytes", 191889: "187 KiB", 1258291: "1.2 MiB"} {
		if got := Bytes(n); got != want {
			t.Errorf("Bytes(%d) = %q, want %q", n, got, want)
		}
	}
}

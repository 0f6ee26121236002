package demo

import (
	"math"
	"strconv"
)

// generatePPP draws the purchasing-power-parity factors: local currency
// units per international dollar, by country and year. Each factor drifts
// with the country's inflation relative to the international dollar, with
// a little year-to-year noise, as published factors do.
func generatePPP(seed uint64) [][]float64 {
	r := stream(seed, 5)
	out := make([][]float64, len(countries))
	for ci, c := range countries {
		f := c.PPP2020
		for range years() {
			// Factors are published to four significant decimals.
			out[ci] = append(out[ci], math.Round(f*10000)/10000)
			f *= (1 + c.Inflation) * (1 + 0.004*r.normal())
		}
	}
	return out
}

// pppCSV writes ppp.csv.
func pppCSV(ppp [][]float64) []byte {
	w := newCSV("country", "year", "factor")
	for ci, c := range countries {
		for t, year := range years() {
			w.row(c.Name, strconv.Itoa(year), num(ppp[ci][t], 4))
		}
	}
	return w.bytes()
}

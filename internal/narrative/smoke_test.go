package narrative

import "testing"

func TestSmoke(t *testing.T) {
	s := parseSituation(t, `
indicators:
  - {key: intl, label: International staff share, unit: percent, better: higher, decimals: 1}
  - {key: spa, label: Students per academic, unit: ratio, better: lower, decimals: 1, judgement: "fewer students per academic can mean more contact time or more research time"}
  - {key: size, label: Student headcount, unit: count, better: neutral, decimals: 0}
focus: F
year: 2025
years: [2021, 2025]
columns: [intl@2021, intl@2025, spa@2021, spa@2025, size@2021, size@2025]
institutions:
  F: [Kestria, Arlen University, 40.0, 45.2, 18.0, 14.2, 20000, 21000]
  A: [Kestria, A, 30, 31, 16, 16, 10000, 11000]
  B: [Kestria, B, 35, 36, 17, 17, 12000, 12500]
  C: [Kestria, C, 38, 40, 15, 15.5, 30000, 31000]
  D: [Veldra, D, 50, 52, 12, 12, 15000, 15000]
  E: [Veldra, E, 20, 22, 20, 21, 9000, 9500]
groups:
  - {name: Kestria sector, where: {country: Kestria}}
  - {name: Competitors, each: country, where: {country: Veldra}}
block: {style: detail}
`)
	c, _, b := s.compose(t)
	t.Log("\n" + render(c.Summary))
	t.Log("\n" + blockText(c, b))
}

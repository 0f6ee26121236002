package demo

// country is one invented higher-education system.
type country struct {
	Name   string // as written in the register's country column
	Prefix string // two letters of the register ids
	// Currency is the invented currency's name and Code its invented
	// three-letter code (chosen not to be an ISO 4217 code in use).
	Currency, Code string
	// PPP2020 is local currency units per international dollar in the first
	// year; Inflation is the yearly drift of that factor relative to the
	// international dollar.
	PPP2020, Inflation float64
	// Size is the number of institutions in the register.
	Size int
	// Style selects the naming conventions (names.go).
	Style nameStyle
	// Regions are the system's invented regions.
	Regions []string
	// Funding shifts research income per academic (log scale); Intl shifts
	// internationalisation (logit scale): small, open systems are more
	// international; IntlTrend moves it each year.
	Funding, Intl, IntlTrend float64
	// Research shifts research intensity of the whole system; ResearchTrend
	// moves it each year (a system investing, or falling back).
	Research, ResearchTrend float64
	// StudentRatio is the system's typical students per academic.
	StudentRatio float64
	// PerStudent is the system's typical non-research income per student
	// in international dollars; Outcomes shifts student continuation,
	// completion and graduate outcomes (logit scale).
	PerStudent, Outcomes float64
}

// countries is the invented world, home system first.
var countries = []country{
	{
		Name: "Kestria", Prefix: "KE", Currency: "Kestrian mark", Code: "KSM",
		PPP2020: 1.31, Inflation: 0.024, Size: 212, Style: styleKestrian,
		Regions: []string{"Northmarch", "Fenlow", "Westreach", "Harrowdale", "Tresselby"},
		Funding: 0.05, Intl: 0.25, IntlTrend: -0.03, Research: 0.10, ResearchTrend: 0.00, StudentRatio: 17, PerStudent: 11800, Outcomes: 0.10,
	},
	{
		Name: "Aldmere", Prefix: "AL", Currency: "Aldmere guilder", Code: "AGZ",
		PPP2020: 0.83, Inflation: 0.018, Size: 188, Style: styleAldmeric,
		Regions: []string{"Aldgau", "Seemark", "Quellgau", "Ostmarrow"},
		Funding: 0.20, Intl: 0.10, IntlTrend: 0.02, Research: 0.15, ResearchTrend: 0.01, StudentRatio: 15, PerStudent: 13500, Outcomes: 0.00,
	},
	{
		Name: "Orvanne", Prefix: "OR", Currency: "Orvanne livre", Code: "OVL",
		PPP2020: 0.92, Inflation: 0.021, Size: 168, Style: styleOrvannais,
		Regions: []string{"Corvaisis", "Varellois", "Brévannie", "Quillonnais"},
		Funding: -0.05, Intl: 0.05, IntlTrend: 0.04, Research: 0.00, ResearchTrend: 0.02, StudentRatio: 19, PerStudent: 10900, Outcomes: -0.15,
	},
	{
		Name: "Nordvald", Prefix: "NV", Currency: "vald krone", Code: "VKX",
		PPP2020: 9.40, Inflation: 0.016, Size: 92, Style: styleNordvaldic,
		Regions: []string{"Skarvland", "Nordkyst", "Vidmark"},
		Funding: 0.30, Intl: 0.55, IntlTrend: 0.03, Research: 0.25, ResearchTrend: 0.01, StudentRatio: 13, PerStudent: 16200, Outcomes: 0.20,
	},
	{
		Name: "Wieldania", Prefix: "WI", Currency: "wield złotar", Code: "WZR",
		PPP2020: 1.86, Inflation: 0.046, Size: 150, Style: styleWieldanian,
		Regions: []string{"Wieldzka", "Brzańska", "Ostrzańska", "Modrzańska"},
		Funding: -0.55, Intl: -0.35, IntlTrend: 0.08, Research: -0.30, ResearchTrend: 0.06, StudentRatio: 21, PerStudent: 7400, Outcomes: -0.25,
	},
	{
		Name: "Lusmara", Prefix: "LU", Currency: "lusmaran real", Code: "LMQ",
		PPP2020: 0.64, Inflation: 0.031, Size: 102, Style: styleLusmaran,
		Regions: []string{"Morenal", "Serranova", "Alvaredo", "Tarrascal"},
		Funding: -0.35, Intl: -0.10, IntlTrend: 0.05, Research: -0.15, ResearchTrend: 0.03, StudentRatio: 23, PerStudent: 6900, Outcomes: -0.20,
	},
}

// years of the scenario.
func years() []int {
	out := make([]int, 0, LastYear-FirstYear+1)
	for y := FirstYear; y <= LastYear; y++ {
		out = append(out, y)
	}
	return out
}

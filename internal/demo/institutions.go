package demo

import (
	"fmt"
	"math"
	"strconv"
)

// mission is the register's mission attribute: the broad kind of
// institution, which drives its latent traits below.
type mission int

const (
	missionResearch mission = iota
	missionTechnical
	missionComprehensive
	missionTeaching
	missionSpecialist
)

var missionNames = [...]string{"research", "technical", "comprehensive", "teaching", "specialist"}

func (m mission) String() string { return missionNames[m] }

// fields are the six broad fields of research and development of the OECD
// Frascati Manual 2015 (Table 2.2, "Fields of Research and Development"),
// an open standard, in dictionary order; the subject profile gives each
// field's share of an institution's papers. Fine fields are the manual's
// second-level codes (1.1 Mathematics, ..., 6.5 Other humanities), used in
// the paper records; Fine lists how many each broad field has.
var fields = []struct {
	Key, Label, Short string
	Fine              int
}{
	{"field_natural", "Share of papers in the natural sciences", "Natural sciences", 7},
	{"field_engineering", "Share of papers in engineering and technology", "Engineering, technology", 11},
	{"field_health", "Share of papers in the medical and health sciences", "Medical, health", 5},
	{"field_agriculture", "Share of papers in the agricultural and veterinary sciences", "Agricultural, veterinary", 5},
	{"field_social", "Share of papers in the social sciences", "Social sciences", 9},
	{"field_humanities", "Share of papers in the humanities and the arts", "Humanities, arts", 5},
}

// institution is one generated institution: its register entry and the
// latent traits its values are drawn from. The latent factors are the
// scenario's model of why measures move together: one research-intensity
// factor drives papers, citation impact, research income, doctorates and
// esteem, so those correlate positively as they do in the trade's
// published data; an internationalisation factor drives the international
// shares; a student-support factor drives continuation, completion and
// graduate outcomes; an exchange factor drives work with industry.
type institution struct {
	ID, Name, Short, Region, Status string
	Country                         int // index into countries
	Founded                         int
	Mission                         mission
	Spec                            specialism
	Young                           bool
	// EntryYear is the first year with values: young institutions enter
	// the data later, so group sizes grow over the span.
	EntryYear int

	Research, ResearchTrend float64 // latent research intensity, per-year drift
	Intl, IntlTrend         float64 // latent internationalisation, per-year drift
	LogAcademics, Growth    float64 // log academic FTE in 2020, yearly log growth
	StudentShift            float64 // log shift of students per academic
	FundingShift            float64 // log shift of research income per academic
	ExchangeShift           float64 // log shift of industry and exchange activity
	ImpactShift             float64 // log shift of citation impact
	Support                 float64 // student support: continuation, completion, outcomes
	Finance                 float64 // financial health: operating surplus
	Profile                 [6]float64
	StaffFTE                int // all staff, last year, a register attribute
}

// missionShare is the share of each system's institutions by mission;
// research-intensive ones are listed first so they hold the lowest ids.
var missionShare = [...]float64{0.065, 0.12, 0.38, 0.345, 0.09}

// generateInstitutions draws the register. Ids run KE001, KE002, ... in
// each system, research-intensive universities first, oldest first.
func generateInstitutions(seed uint64) []institution {
	r := stream(seed, 1)
	var out []institution
	for ci, c := range countries {
		used := map[string]bool{}
		if ci == 0 {
			used[focusPlace] = true
		}
		counts := missionCounts(c.Size)
		n := 0
		for m := missionResearch; m <= missionSpecialist; m++ {
			for k := 0; k < counts[m]; k++ {
				n++
				in := drawInstitution(r, ci, m, k)
				place := placeName(r, c.Style, used)
				in.ID = fmt.Sprintf("%s%03d", c.Prefix, n)
				if in.ID == FocusID {
					focusTraits(&in)
					place = focusPlace
				}
				in.Name, in.Short = institutionName(r, c.Style, in.Mission, in.Spec, in.Young, place)
				out = append(out, in)
			}
		}
	}
	return out
}

// focusPlace is the focus university's town.
const focusPlace = "Wendholm"

func missionCounts(size int) [5]int {
	var c [5]int
	total := 0
	for m := missionResearch; m < missionSpecialist; m++ {
		c[m] = int(math.Round(missionShare[m] * float64(size)))
		total += c[m]
	}
	c[missionSpecialist] = size - total
	return c
}

func drawInstitution(r *rng, ci int, m mission, k int) institution {
	c := countries[ci]
	in := institution{Country: ci, Mission: m, Region: pick(r, c.Regions), Status: "public", EntryYear: FirstYear}
	switch m {
	case missionResearch:
		// The first few are the old research-intensive universities.
		if k < 3 {
			in.Founded = 1380 + r.intn(320)
			in.Research = 1.75 - 0.15*float64(k) + 0.12*r.normal()
		} else {
			in.Founded = 1850 + r.intn(110)
			in.Research = 1.3 + 0.3*r.normal()
		}
		in.LogAcademics = math.Log(2400) + 0.35*r.normal()
	case missionTechnical:
		in.Founded = 1860 + r.intn(120)
		in.Research = 0.45 + 0.5*r.normal()
		in.LogAcademics = math.Log(1200) + 0.45*r.normal()
		in.ExchangeShift = 0.9
	case missionComprehensive:
		in.Founded = 1900 + r.intn(90)
		in.Research = -0.1 + 0.55*r.normal()
		in.LogAcademics = math.Log(800) + 0.5*r.normal()
	case missionTeaching:
		in.Founded = 1890 + r.intn(120)
		in.Research = -1.4 + 0.45*r.normal()
		in.LogAcademics = math.Log(300) + 0.5*r.normal()
		in.StudentShift = 0.25
		if r.chance(0.2) {
			in.Status = "private"
		}
	case missionSpecialist:
		in.Founded = 1820 + r.intn(180)
		in.Spec = specialism(r.intn(5))
		in.Research = -0.6 + 0.6*r.normal()
		in.LogAcademics = math.Log(130) + 0.5*r.normal()
		if in.Spec == specHealth {
			in.Research += 0.6
		}
	}
	in.Growth = 0.008 + 0.01*r.normal()
	in.ResearchTrend = 0.02 * r.normal()
	// A quarter of comprehensive and technical institutions are young and
	// growing fast; a third of those enter the data after the first year.
	if (m == missionComprehensive || m == missionTechnical) && r.chance(0.25) {
		in.Young = true
		in.Founded = 1995 + r.intn(25)
		in.LogAcademics = math.Log(330) + 0.4*r.normal()
		in.Growth = 0.09 + 0.03*r.normal()
		in.ResearchTrend = 0.06 + 0.02*r.normal()
		in.Intl += 0.3
		if in.Founded >= 2008 && r.chance(0.6) {
			in.EntryYear = FirstYear + 1 + r.intn(3)
		}
	}
	in.Research += c.Research
	in.Intl += c.Intl + 0.6*r.normal() + 0.25*in.Research
	in.IntlTrend = c.IntlTrend + 0.02*r.normal()
	in.StudentShift += -0.12*in.Research + 0.15*r.normal()
	in.FundingShift = c.Funding + 0.25*r.normal()
	in.ExchangeShift += 0.6 * r.normal()
	in.ImpactShift = 0.12 * r.normal()
	in.Profile = drawProfile(r, m, in.Spec)
	in.Support = 0.25*in.Research + 0.5*r.normal()
	in.Finance = 0.15*in.Research + 0.45*r.normal()
	in.StaffFTE = 0 // set once the last year's academics are known
	return in
}

// focusTraits sets the focus university's traits so that the demo pack has
// a story to tell: strong citation impact and industry links, research
// income near the sector median, a high student load, a thin operating
// surplus and international student numbers slipping.
func focusTraits(in *institution) {
	in.Founded = 1908
	in.Mission = missionResearch
	in.Region = "Harrowdale"
	in.Status = "public"
	in.Young = false
	in.EntryYear = FirstYear
	in.Research = 1.0
	in.ResearchTrend = 0.015
	in.Intl = 0.05
	in.IntlTrend = -0.09
	in.LogAcademics = math.Log(1650)
	in.Growth = 0.006
	in.StudentShift = 0.22
	in.FundingShift = -0.05
	in.ExchangeShift = 0.75
	in.ImpactShift = 0.16
	in.Support = 0.15
	in.Finance = -0.35
	// natural, engineering, health, agriculture, social, humanities
	in.Profile = [6]float64{0.30, 0.22, 0.17, 0.04, 0.18, 0.09}
}

// profileAlpha are Dirichlet concentration parameters by mission for the
// subject profile (natural, engineering, health, agriculture, social,
// humanities).
var profileAlpha = [...][6]float64{
	missionResearch:      {8.0, 5.0, 6.5, 1.5, 6.0, 3.8},
	missionTechnical:     {6.0, 12.0, 1.2, 1.0, 2.0, 0.5},
	missionComprehensive: {4.0, 3.0, 3.8, 1.0, 5.5, 2.8},
	missionTeaching:      {1.5, 2.0, 5.0, 0.8, 6.0, 2.4},
}

// specField maps a specialism to its dominant field.
var specField = [...]int{specArts: 5, specMusic: 5, specHealth: 2, specAgriculture: 3, specBusiness: 4}

// drawProfile draws a subject profile as a Dirichlet vector through
// normalised gamma draws (the standard construction, e.g. Devroye 1986,
// ch. XI).
func drawProfile(r *rng, m mission, sp specialism) [6]float64 {
	var alpha [6]float64
	if m == missionSpecialist {
		for i := range alpha {
			alpha[i] = 0.35
		}
		alpha[specField[sp]] = 12
	} else {
		alpha = profileAlpha[m]
	}
	var p [6]float64
	sum := 0.0
	for i, a := range alpha {
		p[i] = r.gamma(a)
		sum += p[i]
	}
	for i := range p {
		p[i] /= sum
	}
	return p
}

// registerCSV writes institutions.csv.
func registerCSV(insts []institution) []byte {
	w := newCSV("id", "name", "country", "region", "short_name", "founded", "mission", "status", "staff_fte")
	for _, in := range insts {
		w.row(in.ID, in.Name, countries[in.Country].Name, in.Region, in.Short,
			strconv.Itoa(in.Founded), in.Mission.String(), in.Status, strconv.Itoa(in.StaffFTE))
	}
	return w.bytes()
}

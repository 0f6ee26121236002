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

// subjects are the six broad subject areas of the output profile, in
// dictionary order.
var subjects = []struct{ Key, Label, Short string }{
	{"subj_arts", "Share of output in arts and humanities", "Arts & humanities"},
	{"subj_social", "Share of output in social sciences and business", "Social sciences"},
	{"subj_life", "Share of output in life sciences", "Life sciences"},
	{"subj_health", "Share of output in health and medicine", "Health"},
	{"subj_physical", "Share of output in physical sciences", "Physical sciences"},
	{"subj_engineering", "Share of output in engineering and computing", "Engineering"},
}

// institution is one generated institution: its register entry and the
// latent traits its values are drawn from. The latent factors are the
// scenario's model of why measures move together: one research-intensity
// factor drives papers, citation impact, research income, doctorates and
// reputation, so those correlate positively as they do in the trade's
// published data; an internationalisation factor drives the international
// shares.
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
	IndustryShift           float64 // log shift of industry income per academic
	ImpactShift             float64 // log shift of citation impact
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
		in.IndustryShift = 0.9
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
	in.IndustryShift += 0.6 * r.normal()
	in.ImpactShift = 0.12 * r.normal()
	in.Profile = drawProfile(r, m, in.Spec)
	in.StaffFTE = 0 // set once the last year's academics are known
	return in
}

// focusTraits sets the focus university's traits so that the demo pack has
// a story to tell: strong citation impact and industry links, research
// income near the sector median, a high student load and international
// student numbers slipping.
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
	in.IndustryShift = 0.75
	in.ImpactShift = 0.16
	in.Profile = [6]float64{0.09, 0.17, 0.18, 0.16, 0.17, 0.23}
}

// profileAlpha are Dirichlet concentration parameters by mission for the
// subject profile (arts, social, life, health, physical, engineering).
var profileAlpha = [...][6]float64{
	missionResearch:      {3.6, 6.0, 6.6, 6.0, 6.0, 4.2},
	missionTechnical:     {0.6, 2.0, 1.6, 1.0, 5.0, 10.0},
	missionComprehensive: {2.5, 5.0, 3.0, 3.8, 3.0, 2.8},
	missionTeaching:      {2.4, 6.0, 1.6, 5.0, 1.2, 2.0},
}

// specSubject maps a specialism to its dominant subject.
var specSubject = [...]int{specArts: 0, specMusic: 0, specHealth: 3, specAgriculture: 2, specBusiness: 1}

// drawProfile draws a subject profile as a Dirichlet vector through
// normalised gamma draws (the standard construction, e.g. Devroye 1986,
// ch. XI).
func drawProfile(r *rng, m mission, sp specialism) [6]float64 {
	var alpha [6]float64
	if m == missionSpecialist {
		for i := range alpha {
			alpha[i] = 0.35
		}
		alpha[specSubject[sp]] = 12
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

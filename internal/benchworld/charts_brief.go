package benchworld

import (
	"fmt"
	"strings"
)

// BriefCharts names the 24-chart brief (Options.Brief): the same world,
// usually small (640 institutions in 12 systems), with 24 charts and
// little else, for timing chart drawing against a plotting library
// (examples/bench/charts_peer.py draws the same charts).
const BriefCharts = "charts"

// chartSpec is one chart of the 24-chart brief. examples/bench/charts_peer.py
// reads the chart blocks from the written brief, so it draws whatever list
// is here; it knows the kinds box, trend, scatter, bars, heatmap, radar.
type chartSpec struct {
	kind   string
	groups []string
	inds   []string
	title  string
	fit    bool
	limit  int
}

// ChartCount is the number of charts of the 24-chart brief.
const ChartCount = 24

var chartSpecs = func() []chartSpec {
	home := []string{"System 001", "World"}
	sys6 := []string{"System 001", "System 002", "System 003", "System 004", "System 005", "System 006"}
	return []chartSpec{
		// Research
		{kind: "box", groups: home, inds: []string{"citation_impact", "top10_share", "papers_per_academic"}, title: "Research output and impact"},
		{kind: "box", groups: home, inds: []string{"research_income_per_academic", "doctorates_per_academic"}, title: "Research income and doctorates"},
		{kind: "trend", groups: home, inds: []string{"citation_impact", "papers_per_academic"}, title: "Research over the span"},
		{kind: "scatter", groups: []string{"System 001"}, inds: []string{"research_income_per_academic", "citation_impact"}, fit: true, title: "Research income and citation impact"},
		{kind: "scatter", groups: []string{"World"}, inds: []string{"papers_per_academic", "top10_share"}, fit: true, title: "Papers per academic and top 10% share"},
		{kind: "bars", groups: []string{"System 001"}, inds: []string{"citation_impact"}, limit: 15, title: "Citation impact, leading institutions of the home system"},
		// Collaboration and people
		{kind: "box", groups: home, inds: []string{"intl_coauthorship", "industry_coauthorship"}, title: "International and industry co-authorship"},
		{kind: "box", groups: home, inds: []string{"intl_staff_share", "intl_student_share"}, title: "International staff and students"},
		{kind: "trend", groups: home, inds: []string{"intl_staff_share", "intl_student_share"}, title: "International staff and students over the span"},
		{kind: "scatter", groups: []string{"World"}, inds: []string{"intl_staff_share", "intl_coauthorship"}, title: "International staff and co-authorship"},
		{kind: "bars", groups: []string{"World"}, inds: []string{"intl_coauthorship"}, limit: 20, title: "International co-authorship, leading institutions of the world"},
		{kind: "radar", groups: []string{"System 001"}, inds: []string{"citation_impact", "top10_share", "papers_per_academic", "intl_coauthorship", "intl_staff_share", "completion_rate", "peer_esteem", "exchange_income_per_academic"}, title: "Profile against the home system"},
		// Students
		{kind: "box", groups: home, inds: []string{"students_per_academic", "continuation_rate", "completion_rate"}, title: "Students and their progress"},
		{kind: "box", groups: home, inds: []string{"graduate_outcomes"}, title: "Graduate outcomes"},
		{kind: "trend", groups: home, inds: []string{"completion_rate", "continuation_rate"}, title: "Completion and continuation over the span"},
		{kind: "scatter", groups: []string{"World"}, inds: []string{"students_per_academic", "completion_rate"}, title: "Students per academic and completion"},
		{kind: "bars", groups: []string{"System 001"}, inds: []string{"completion_rate"}, limit: 15, title: "Completion, leading institutions of the home system"},
		{kind: "heatmap", groups: sys6, inds: []string{"citation_impact", "top10_share", "papers_per_academic", "research_income_per_academic", "intl_coauthorship", "intl_student_share", "students_per_academic", "completion_rate"}, title: "Percentile of the focus within the largest systems"},
		// Finance and esteem
		{kind: "box", groups: home, inds: []string{"income_per_student", "operating_surplus", "research_income_share"}, title: "Finance"},
		{kind: "box", groups: home, inds: []string{"peer_esteem", "exchange_income_per_academic"}, title: "Esteem and knowledge exchange"},
		{kind: "trend", groups: home, inds: []string{"income_per_student", "peer_esteem"}, title: "Income and esteem over the span"},
		{kind: "scatter", groups: []string{"System 001"}, inds: []string{"income_per_student", "peer_esteem"}, fit: true, title: "Income per student and peer esteem"},
		{kind: "bars", groups: []string{"World"}, inds: []string{"peer_esteem"}, limit: 20, title: "Peer esteem, leading institutions of the world"},
		{kind: "heatmap", groups: sys6, inds: []string{"income_per_student", "operating_surplus", "research_income_share", "peer_esteem", "exchange_income_per_academic", "spinouts"}, title: "Finance and esteem, percentile of the focus within the largest systems"},
	}
}()

// chartsBrief is the 24-chart brief's text for a focus, brief year and span.
func chartsBrief(focus string, year, first, last int) string {
	var b strings.Builder
	fmt.Fprintf(&b, `---
# The 24-chart benchmark brief: charts and little else. Every institution,
# system and figure is invented and drawn from a fixed seed.
title: Charts of the benchmark world
subtitle: Institution 00007 in 24 charts
audience: Benchmark
author: Benchmark scenario
focus: %s
year: %d
years: [%d, %d]
data:
  register: institutions.csv
  values: values.csv
  dictionary: indicators.yaml
groups:
  - name: World
    where: {}
  - each: country
theme:
  paper: a4
---
`, focus, year, first, last)
	sections := []string{"Research", "Collaboration and people", "Students", "Finance and esteem"}
	for i, c := range chartSpecs {
		if i%6 == 0 {
			fmt.Fprintf(&b, "\n# %s\n", sections[i/6])
		}
		fmt.Fprintf(&b, "\n```chart\nkind: %s\ngroups: [%s]\nindicators: [%s]\n", c.kind, strings.Join(c.groups, ", "), strings.Join(c.inds, ", "))
		if c.fit {
			b.WriteString("fit: true\n")
		}
		if c.limit > 0 {
			fmt.Fprintf(&b, "limit: %d\n", c.limit)
		}
		fmt.Fprintf(&b, "title: %s\ncaption: Brief year %d.\n```\n", c.title, year)
	}
	return b.String()
}

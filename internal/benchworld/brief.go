package benchworld

// briefText is the benchmark brief: %s focus, %d year, %d and %d the span.
// Twelve charts, five tables and four commentary blocks over the focus's
// own system, every system (each: country) and the whole world.
const briefText = `---
# The world-sized benchmark brief. Every institution, system and figure is
# invented and drawn from a fixed seed.
title: World position
subtitle: Institution 00007 against its own system and every other
audience: International office
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
  - name: Home region
    where: {region: Region 1}
theme:
  paper: a4
---

# Summary

` + "```" + `commentary
style: summary
groups: [System 001]
indicators: [citation_impact, top10_share, papers_per_academic, research_income_per_academic, intl_coauthorship, intl_staff_share, intl_student_share, students_per_academic, completion_rate, peer_esteem]
topics: [position, strengths, gaps, change]
` + "```" + `

` + "```" + `table
kind: position
groups: [System 001, World]
indicators: [citation_impact, top10_share, papers_per_academic, research_income_per_academic, intl_coauthorship, industry_coauthorship, intl_staff_share, intl_student_share, students_per_academic, doctorates_per_academic]
caption: Position in the home system and the world.
` + "```" + `

# Research

` + "```" + `chart
kind: box
groups: [System 001, World]
indicators: [citation_impact, top10_share, papers_per_academic]
title: Research output and impact
caption: Home system and world.
` + "```" + `

` + "```" + `chart
kind: box
groups: [System 001, World]
indicators: [research_income_per_academic, doctorates_per_academic]
title: Research income and doctorates
caption: Home system and world.
` + "```" + `

` + "```" + `chart
kind: trend
groups: [System 001, World]
indicators: [citation_impact, papers_per_academic]
title: Research over the span
caption: Median and interquartile range by year.
` + "```" + `

` + "```" + `chart
kind: scatter
groups: [System 001]
indicators: [research_income_per_academic, citation_impact]
fit: true
title: Research income and citation impact
caption: Home system.
` + "```" + `

` + "```" + `commentary
style: detail
groups: [System 001, World]
topics: [position, change]
indicators: [citation_impact, top10_share, papers_per_academic, research_income_per_academic]
` + "```" + `

# Collaboration and people

` + "```" + `chart
kind: box
groups: [System 001, World]
indicators: [intl_coauthorship, industry_coauthorship, intl_staff_share, intl_student_share]
title: International and industry links
caption: Home system and world.
` + "```" + `

` + "```" + `chart
kind: trend
groups: [System 001, World]
indicators: [intl_staff_share, intl_student_share]
title: International staff and students over the span
caption: Median and interquartile range by year.
` + "```" + `

` + "```" + `chart
kind: scatter
groups: [World]
indicators: [students_per_academic, completion_rate]
title: Students per academic and completion
caption: World.
` + "```" + `

` + "```" + `table
kind: position
groups: [System 001, Home region]
indicators: [intl_staff_share, intl_student_share, students_per_academic, continuation_rate, completion_rate, graduate_outcomes]
caption: People and student outcomes.
` + "```" + `

# Every system

` + "```" + `chart
kind: bars
groups: [System 001]
indicators: [citation_impact]
limit: 15
title: Citation impact, leading institutions of the home system
caption: The fifteen highest and the focus.
` + "```" + `

` + "```" + `chart
kind: heatmap
groups: [System 001, System 002, System 003, System 004, System 005, System 006]
indicators: [citation_impact, top10_share, papers_per_academic, research_income_per_academic, intl_coauthorship, intl_student_share, students_per_academic, completion_rate]
title: Percentile of the focus within the largest systems
caption: Where the focus would stand in each.
` + "```" + `

` + "```" + `table
kind: groups
groups: [System 001, System 002, System 003, System 004, System 005, System 006, System 007, System 008]
indicators: [citation_impact, papers_per_academic, research_income_per_academic, intl_coauthorship, intl_student_share]
caption: System medians.
` + "```" + `

` + "```" + `commentary
style: detail
groups: [System 002, System 003, System 004, System 005]
topics: [competition]
indicators: [citation_impact, intl_coauthorship, intl_student_share]
` + "```" + `

# Finance and esteem

` + "```" + `chart
kind: box
groups: [System 001, World]
indicators: [income_per_student, operating_surplus, research_income_share]
title: Finance
caption: Home system and world.
` + "```" + `

` + "```" + `chart
kind: radar
groups: [System 001]
indicators: [citation_impact, top10_share, papers_per_academic, intl_coauthorship, intl_staff_share, completion_rate, peer_esteem, exchange_income_per_academic]
title: Profile against the home system
caption: Percentile on each indicator.
` + "```" + `

` + "```" + `chart
kind: bars
groups: [World]
indicators: [peer_esteem]
limit: 20
title: Peer esteem, leading institutions of the world
caption: The twenty most voted and the focus.
` + "```" + `

` + "```" + `table
kind: position
groups: [System 001, World]
indicators: [income_per_student, operating_surplus, research_income_share, peer_esteem, exchange_income_per_academic, spinouts]
caption: Finance, esteem and knowledge exchange.
` + "```" + `

` + "```" + `commentary
style: bullets
groups: [System 001]
indicators: [income_per_student, operating_surplus, research_income_share, peer_esteem, exchange_income_per_academic, spinouts]
topics: [strengths, gaps]
` + "```" + `

# Who is compared

` + "```" + `table
kind: population
groups: [World, System 001, System 002, System 003]
caption: Institutions in each group.
` + "```" + `
`

// Package records computes indicators from record-level files: papers (with
// fields, citations and affiliations) and peer-survey votes. Its output is
// ordinary indicator values (institution, year, indicator, value), which the
// dataset loader stages like the rows of a values file, so everything after
// loading is unchanged.
//
// # Papers
//
// Input: one row per paper (`paper,year,type,field,citations,institutions,
// countries[,affiliation_types]`, lists separated by semicolons) or one row
// per paper and affiliation (`paper,year,type,field,citations,institution,
// country[,affiliation_type]`, the rows of one paper adjacent); the shape is
// read from the header. CSV or Parquet with the same column names.
//
// Field-normalised citation impact is the item-oriented mean normalised
// citation score (Waltman, van Eck, van Leeuwen, Visser and van Raan 2011,
// "Towards a new crown indicator", Journal of Informetrics 5(1); the same
// definition as the Snowball Metrics recipe for citation impact): each
// paper's citations divided by the expected citations, the mean over every
// paper of the same field, publication year and document type; an
// institution's value is the mean of its papers' ratios, so 1.00 is the
// world average.
//
// A paper in k fields counts 1/k in each field's baseline (papers and
// citations alike) and its own score is the mean of its k per-field ratios.
// With these fractional field weights the world mean of the scores is
// exactly 1 (sum over papers of (1/k) c/e_f = sum over fields of W_f e_f /
// e_f = number of papers). A field whose baseline has zero mean citations
// gives no ratio: the paper's score is the mean over its other fields, and
// a paper with no such field has no score (counted, never a division by
// zero).
//
// Top 10 % share: a paper belongs to the 10 % most cited of its field, year
// and type; the papers tied at the threshold share the remaining room
// fractionally, so that exactly 10 % of every baseline's (weighted) papers
// are in its top 10 % (Waltman and Schreiber 2013, "On the calculation of
// percentile-based bibliometric indicators", JASIST 64(2)).
//
// International co-authorship: papers with affiliations in two or more
// distinct countries. Industry co-authorship: papers with an affiliation of
// type "industry" (only when the file has an affiliation type column).
// Subject profile: the share of output in each of the six broad fields of
// the OECD Frascati Manual 2015 (table 2.2: 1 natural sciences, 2
// engineering and technology, 3 medical and health sciences, 4
// agricultural and veterinary sciences, 5 social sciences, 6 humanities
// and the arts); a fine field maps to the broad field its code starts with
// ("2.11" and "2.11.04" are engineering and technology).
//
// Counting: full counting gives every institution on a paper the whole
// paper; fractional counting gives each of its m institutions 1/m. Windows:
// every indicator for each end year Y over the papers published in the N
// years ending at Y; by default one window over the whole span.
//
// The baselines table (expected citations, top 10 % threshold and tie share
// per field, year and type) is the only world-wide aggregate. The full run
// computes it in a first pass over the file and the institutions'
// indicators in a second; a run over an institution's own papers with a
// supplied table takes the second pass alone, so the two give identical
// values (tested).
//
// # Votes
//
// See votes.go: post-stratification or raking of respondent weights to
// target shares, a weight cap, Kish's effective sample size, and per
// institution the weighted votes normalised to the most voted = 100, per
// field, the home-country share and the spread over regions.
package records

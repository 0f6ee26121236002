// Package narrative writes the pack's comparative commentary from the
// figures model. Every sentence records the figure keys it used, and every
// number in a sentence is one of those figures printed with package format,
// so a sentence shows the same digits as the tables and charts beside it
// (Verify checks this).
//
// The package has three layers: the planner (plan_*.go) decides what is
// worth saying from the model and gathers the figures; the wording
// (wording.go, wording_en.go) turns those facts into sentences in one
// language; rows.go and verify.go record and check what was written.
package narrative

import "peerpack/internal/figures"

// Sentence is one written sentence with the figures it cites.
type Sentence struct {
	Text  string
	Cites []figures.Key
	// Thresholds lists the method constants the sentence prints (the
	// small-group minimum, the coverage floor), which are rules of the
	// method rather than figures of the model, and the counts of
	// indicators a cut list leaves out ("and 12 other indicators").
	// Verify accepts exactly these besides the cited figures.
	Thresholds []float64
	// Claims are the comparisons the sentence makes (see claims.go);
	// Verify evaluates each against the model.
	Claims []Claim
	// About is the indicator the sentence is about ("" for general
	// sentences); Part names where it appears ("summary", "block-02").
	About string
	Part  string
}

// Paragraph is a run of sentences; Bullet marks one bullet point.
type Paragraph struct {
	// Heading, when set, is a short run-in heading ("Strengths").
	Heading   string
	Sentences []Sentence
	Bullet    bool
}

// Text joins the paragraph's sentences with single spaces.
func (p Paragraph) Text() string {
	s := ""
	for i, x := range p.Sentences {
		if i > 0 {
			s += " "
		}
		s += x.Text
	}
	return s
}

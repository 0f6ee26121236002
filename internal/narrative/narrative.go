// Package narrative writes the pack's comparative commentary from the
// figures model. Every sentence records the figure keys it used.
package narrative

import "peerpack/internal/figures"

// Sentence is one written sentence with the figures it cites.
type Sentence struct {
	Text  string
	Cites []figures.Key
}

// Paragraph is a run of sentences; Bullet marks one bullet point.
type Paragraph struct {
	// Heading, when set, is a short run-in heading ("Strengths").
	Heading   string
	Sentences []Sentence
	Bullet    bool
}

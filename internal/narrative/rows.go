package narrative

import (
	"fmt"

	"peerpack/internal/figures"
)

// commentaryRows records every sentence in the figures file. Sentence n
// (1-based, in pack order) gives:
//
//	commentary,<part>,<indicator>,#0001,,sentence,<text>
//	commentary,<part>,<indicator>,#0001,,cites.001,<cited key>
//	commentary,<part>,<indicator>,#0001,,cites.002,<cited key>
//	commentary,<part>,<indicator>,#0001,,claim.001,<LEFT OP RIGHT>
//
// where part is "summary" or "block-NN" (the NNth commentary block of the
// brief), indicator is the indicator the sentence is about (empty for
// general sentences), the institution column carries the sentence number
// zero-padded to four digits so byte order is pack order, and each cited
// key is written as section/group/indicator/institution/year/measure.
// Claim rows (claims.go) hold "LEFT OP RIGHT" with OP one of < <= = >= >
// != and each side a number, "cites.NNN" (one of the sentence's
// citations) or a figure key written as cites rows write it.
// Keys are unique, so the figures file stays sorted and stable.
func commentaryRows(ss []Sentence) []figures.Row {
	var rows []figures.Row
	for i, s := range ss {
		k := figures.Key{Section: figures.SectionCommentary, Group: s.Part, Indicator: s.About, Institution: sentenceID(i + 1)}
		k.Measure = "sentence"
		rows = append(rows, figures.Row{Key: k, Text: s.Text, IsText: true})
		for j, ck := range s.Cites {
			k.Measure = citeMeasure(j + 1)
			rows = append(rows, figures.Row{Key: k, Text: ck.String(), IsText: true})
		}
		for j, cl := range s.Claims {
			k.Measure = claimMeasure(j + 1)
			rows = append(rows, figures.Row{Key: k, Text: cl.text(s.Cites), IsText: true})
		}
	}
	return rows
}

// sentenceID is the institution column of a sentence's rows.
func sentenceID(n int) string { return fmt.Sprintf("#%04d", n) }

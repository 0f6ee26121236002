package narrative_test

import (
	"fmt"
	"testing"

	"peerpack/internal/narrative"
)

func TestScratchDump(t *testing.T) {
	m, b := demoModel(t)
	c, err := narrative.Compose(m, b)
	if err != nil {
		t.Fatal(err)
	}
	for _, p := range c.Summary {
		fmt.Println("SUMMARY|", p.Heading)
		for _, s := range p.Sentences {
			fmt.Println("  ", s.Text)
		}
	}
}

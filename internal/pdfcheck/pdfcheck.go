// Package pdfcheck validates a PDF against ISO 32000-1 with pdfcpu's
// strict mode, for the tests of every package that writes packs. Only
// tests import it, so pdfcpu is not linked into the peerpack binary.
package pdfcheck

import (
	"bytes"
	"fmt"

	"github.com/pdfcpu/pdfcpu/pkg/api"
	"github.com/pdfcpu/pdfcpu/pkg/pdfcpu/model"
)

func init() {
	// Keep pdfcpu from reading or writing a config.yml in the user's
	// configuration folder: the tests must not depend on the machine.
	model.ConfigPath = "disable"
}

// Strict validates pdf with pdfcpu in strict mode (every rule of ISO
// 32000-1:2008 that pdfcpu checks, none relaxed).
func Strict(pdf []byte) error {
	conf := model.NewDefaultConfiguration()
	conf.ValidationMode = model.ValidationStrict
	if err := api.Validate(bytes.NewReader(pdf), conf); err != nil {
		return fmt.Errorf("pdfcpu strict validation: %w", err)
	}
	return nil
}

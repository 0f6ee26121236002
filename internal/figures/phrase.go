package figures

import "strings"

// PhraseValue is the slot of a group's phrase that an each group fills
// with its value: "the {value} system".
const PhraseValue = "{value}"

// phraseOf fills the brief's phrase for one resolved group. Spaces are
// collapsed so that a phrase written over two YAML lines reads as one.
func phraseOf(phrase, eachValue string) string {
	phrase = strings.Join(strings.Fields(phrase), " ")
	if eachValue != "" {
		phrase = strings.ReplaceAll(phrase, PhraseValue, eachValue)
	}
	return phrase
}

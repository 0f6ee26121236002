package narrative

import (
	"strings"
	"unicode"
	"unicode/utf8"

	"peerpack/internal/figures"
)

// How English sentences name a group. A governing body reads "ranks 77th
// of 107 in the Kestrian sector", "among the chosen peers", "in Aldmere",
// not the bare group label of the brief.
//
// The rule (common practice of English house style, no source):
//   - the brief's phrase: wins, as written ({value} already filled in);
//   - an each group: its value alone, a place name ("Aldmere");
//   - a name opening with a determiner (The, Our, All, Every, These,
//     Those): the name, its first letter lowered ("our peers");
//   - a one-word name that looks like a proper noun (capitalised, not a
//     common word): the name alone ("Kestria");
//   - otherwise "the " + the name, its first letter lowered unless the
//     first word looks like a proper noun: "the Kestrian sector", "the
//     chosen peers", "the profile peers".
//
// A first word looks like a proper noun when it starts with a capital and
// is not one of commonGroupWords, the words brief authors capitalise only
// because they open the name.

// commonGroupWords are capitalised first words of group names that are
// not proper nouns.
var commonGroupWords = map[string]bool{
	"home": true, "chosen": true, "profile": true, "competitor": true, "competitors": true,
	"peer": true, "peers": true, "nearest": true, "research": true, "comparison": true,
	"selected": true, "sector": true, "group": true, "national": true, "international": true,
	"regional": true, "similar": true, "teaching": true, "technical": true, "specialist": true,
	"large": true, "small": true, "other": true, "main": true, "core": true, "aspirational": true,
	"benchmark": true, "mission": true, "university": true, "universities": true, "institutions": true,
	"comparator": true, "comparators": true, "founding": true, "partner": true, "partners": true,
	"strategic": true, "key": true, "target": true, "leading": true, "reference": true, "new": true,
	"agreed": true, "aspirant": true, "closest": true, "direct": true, "agreed-upon": true, "named": true,
}

// groupDeterminers open a name that needs no article of its own.
var groupDeterminers = map[string]bool{
	"the": true, "our": true, "all": true, "every": true, "these": true, "those": true,
}

// GroupPhrase names a group in running text (see the rule above).
func (english) GroupPhrase(g *figures.Group) string {
	if g.Phrase != "" {
		return g.Phrase
	}
	if g.Kind == "each" && g.EachValue != "" {
		return g.EachValue
	}
	return defaultGroupPhrase(g.Name)
}

// defaultGroupPhrase derives the phrase of a group that has none from its
// name.
func defaultGroupPhrase(name string) string {
	name = strings.Join(strings.Fields(name), " ")
	if name == "" {
		return name
	}
	first, rest, _ := strings.Cut(name, " ")
	lower := strings.ToLower(first)
	switch {
	case groupDeterminers[lower]:
		return lowerFirst(first) + tail(rest)
	case looksProper(first) && rest == "":
		return name
	case looksProper(first):
		return "the " + name
	}
	return "the " + lowerFirst(name)
}

func tail(rest string) string {
	if rest == "" {
		return ""
	}
	return " " + rest
}

// looksProper reports whether a word reads as a proper noun: it opens
// with a capital and is not a common word capitalised for opening a name.
func looksProper(word string) bool {
	r, _ := utf8.DecodeRuneInString(word)
	if !unicode.IsUpper(r) {
		return false
	}
	return !commonGroupWords[strings.ToLower(strings.TrimFunc(word, func(r rune) bool { return !unicode.IsLetter(r) }))]
}

// in puts the right preposition before a group's phrase: "among" for a
// set of institutions named by a plural noun ("among the chosen peers"),
// "in" for a sector, system or place ("in the Kestrian sector", "in
// Aldmere"). The noun is plural when the phrase's last word is in lower
// case and ends in a plural "s" (not "ss", "us" or "is"); a capitalised
// last word is a proper noun and takes "in" (common practice, no source).
func (english) in(phrase string) string {
	if pluralPhrase(phrase) {
		return "among " + phrase
	}
	return "in " + phrase
}

func pluralPhrase(phrase string) bool {
	words := strings.Fields(phrase)
	if len(words) == 0 {
		return false
	}
	last := strings.TrimRightFunc(words[len(words)-1], func(r rune) bool { return !unicode.IsLetter(r) })
	r, _ := utf8.DecodeRuneInString(last)
	if last == "" || !unicode.IsLower(r) {
		return false
	}
	if !strings.HasSuffix(last, "s") {
		return last == "people"
	}
	for _, not := range []string{"ss", "us", "is"} {
		if strings.HasSuffix(last, not) {
			return false
		}
	}
	return true
}

package demo

import (
	"strings"
	"unicode"
	"unicode/utf8"
)

// Every institution name is built from an invented place name and a naming
// pattern of its system's language. The place names join invented stems to
// ordinary place-name endings; the stems were chosen to sound plausible in
// each language, and every stem and ending pair was checked against a
// gazetteer of real places: names_test.go checks every word of every
// generated name against the GeoNames-derived word list in testdata, so a
// stem that happens to make a real place name fails the tests.

type nameStyle int

const (
	styleKestrian nameStyle = iota
	styleAldmeric
	styleOrvannais
	styleNordvaldic
	styleWieldanian
	styleLusmaran
)

// specialism is the field of a specialist institution.
type specialism int

const (
	specArts specialism = iota
	specMusic
	specHealth
	specAgriculture
	specBusiness
)

var placeParts = map[nameStyle]struct{ stems, endings []string }{
	styleKestrian: {
		stems:   []string{"Brask", "Corrow", "Draith", "Felm", "Gorsey", "Haskel", "Ilver", "Jessam", "Ludder", "Marrow", "Nethel", "Orrin", "Pellam", "Quarn", "Rookel", "Sallow", "Umber", "Vellan", "Wexen", "Yarrow", "Ebbel", "Tarnel", "Cowdry", "Fennick", "Grisel", "Hollin", "Kettle", "Lammer", "Mossel", "Pindle", "Ravel", "Tuffle", "Whin"},
		endings: []string{"holm", "mere", "wick", "dale", "bury", "stead", "combe", "ley", "brook", "minster", "haven", "field", "thorpe", "gate"},
	},
	styleAldmeric: {
		stems:   []string{"Aldmer", "Quell", "Vorl", "Sarn", "Trell", "Mirn", "Falk", "Hadel", "Wendel", "Rosk", "Pfarn", "Ummer", "Dorl", "Hessel", "Murr", "Quarz", "Strell", "Wirk", "Grumm", "Pleck", "Tresch", "Hunkel", "Zwirn", "Blaus", "Fiel"},
		endings: []string{"stadt", "burg", "heim", "feld", "dorf", "au", "brück", "hausen", "berg", "tal", "ingen", "wald"},
	},
	styleOrvannais: {
		stems:   []string{"Bré", "Corv", "Dourn", "Éval", "Fontar", "Gréz", "Lavaud", "Morz", "Pél", "Roch", "Tourn", "Varel", "Chasm", "Escl", "Ormes", "Quill", "Brésq", "Cambr", "Dévr", "Fauq", "Gorv", "Jouv", "Lusq", "Sarq", "Tréb", "Vauq"},
		endings: []string{"ennes", "ac", "ières", "ois", "eux", "ville", "court", "mont", "ange", "anne", "elles", "ignan"},
	},
	styleNordvaldic: {
		stems:   []string{"Skjær", "Bjør", "Fjell", "Skarv", "Kvist", "Snjø", "Trøll", "Vølv", "Ljør", "Gjev", "Skyr", "Hjør", "Tvær"},
		endings: []string{"nes", "vik", "dal", "berg", "heim", "sund", "fjord", "stad", "våg", "land", "øy"},
	},
	styleWieldanian: {
		stems:   []string{"Brzez", "Ostrz", "Wrzos", "Modrz", "Jawor", "Cis", "Sosn", "Krusz", "Msz", "Łęk", "Borz", "Świerk", "Olsz", "Grab", "Buk", "Lip", "Wierzb", "Kalin", "Jarzęb", "Źródł", "Kłod", "Wiśn", "Żmij", "Rdest", "Gniew", "Czer", "Zawoj", "Miedź", "Trzcin", "Ols"},
		endings: []string{"owiańsk", "eńsk", "yńsk", "ańsk", "ick", "owsk", "ieck", "iańsk"},
	},
	styleLusmaran: {
		stems:   []string{"Alvar", "Brav", "Cerr", "Ferrag", "Gand", "Mirag", "Orv", "Ribal", "Santel", "Tarr", "Valder", "Crast", "Fuzel", "Grend", "Murç", "Pomb", "Tozel", "Vulg"},
		endings: []string{"ém", "ão", "osa", "ada", "ela", "eiro", "ales", "edo", "ira", "ança", "ilha", "ares"},
	},
}

// placeName draws an invented place name for the style that is not yet
// used. For Wieldania the "place" is an adjective stem, inflected by the
// naming pattern. Each style offers several times more stem and ending
// pairs than its system has institutions; should the pairs ever run short,
// two stems are joined, so the draw always ends.
func placeName(r *rng, st nameStyle, used map[string]bool) string {
	for try := 0; ; try++ {
		p := joinPlace(r, st, try >= 200)
		if !used[p] {
			used[p] = true
			return p
		}
	}
}

func joinPlace(r *rng, st nameStyle, twoStems bool) string {
	p := placeParts[st]
	stem, end := pick(r, p.stems), pick(r, p.endings)
	if twoStems {
		stem += strings.ToLower(pick(r, p.stems))
	}
	// Avoid doubled letters at the join ("Wexxholm") that read as typos.
	if sl, _ := utf8.DecodeLastRuneInString(stem); strings.HasPrefix(end, string(sl)) {
		end = end[utf8.RuneLen(sl):]
	}
	return stem + end
}

// institutionName returns the full name and short name of an institution
// with the given mission at the place.
func institutionName(r *rng, st nameStyle, m mission, sp specialism, young bool, place string) (name, short string) {
	short = place
	switch st {
	case styleKestrian:
		switch m {
		case missionResearch:
			return "University of " + place, place
		case missionTechnical:
			if r.chance(0.5) {
				return place + " Institute of Technology", place + " Tech"
			}
			return place + " University of Technology", place + " Tech"
		case missionComprehensive:
			if young {
				return place + " New University", place + " New"
			}
			return place + " University", place
		case missionTeaching:
			return pick(r, []string{place + " College", place + " University College", place + " College of Higher Education"}), place
		case missionSpecialist:
			return [...]string{place + " School of Art and Design", place + " Conservatoire of Music", place + " School of Medicine and Nursing", place + " Agricultural College", place + " School of Business"}[sp], place
		}
	case styleAldmeric:
		switch m {
		case missionResearch, missionComprehensive:
			if young {
				return "Neue Universität " + place, "NU " + place
			}
			return "Universität " + place, place
		case missionTechnical:
			return "Technische Universität " + place, "TU " + place
		case missionTeaching:
			return pick(r, []string{"Hochschule " + place, "Fachhochschule " + place}), "HS " + place
		case missionSpecialist:
			return [...]string{"Kunsthochschule " + place, "Musikhochschule " + place, "Medizinische Hochschule " + place, "Hochschule für Landbau " + place, "Handelshochschule " + place}[sp], place
		}
	case styleOrvannais:
		de := elide("de", place)
		switch m {
		case missionResearch, missionComprehensive:
			if young {
				return "Université nouvelle " + de, place
			}
			return "Université " + de, place
		case missionTechnical:
			return "Université technologique " + de, "UT " + place
		case missionTeaching:
			return pick(r, []string{"Institut universitaire " + de, "École supérieure " + de}), place
		case missionSpecialist:
			return [...]string{"École des beaux-arts " + de, "Conservatoire supérieur " + de, "École de santé " + de, "École d'agronomie " + de, "École de commerce " + de}[sp], place
		}
	case styleNordvaldic:
		switch m {
		case missionResearch, missionComprehensive:
			if young {
				return "Nye universitetet i " + place, place
			}
			return "Universitetet i " + place, place
		case missionTechnical:
			return "Teknisk universitet i " + place, "TU " + place
		case missionTeaching:
			return "Høgskolen i " + place, "HI " + place
		case missionSpecialist:
			return [...]string{"Kunsthøgskolen i " + place, "Musikkhøgskolen i " + place, "Helsehøgskolen i " + place, "Landbrukshøgskolen i " + place, "Handelshøgskolen i " + place}[sp], place
		}
	case styleWieldanian:
		// The place is an adjective stem: masculine for Uniwersytet,
		// feminine for Politechnika and Akademia, genitive after Sztuki.
		masc, fem := place+"i", place+"a"
		switch m {
		case missionResearch, missionComprehensive:
			if young {
				return "Nowy Uniwersytet " + masc, "Nowy Uniw. " + masc
			}
			return "Uniwersytet " + masc, "Uniw. " + masc
		case missionTechnical:
			return "Politechnika " + fem, "Polit. " + fem
		case missionTeaching:
			return "Akademia " + fem, "Akad. " + fem
		case missionSpecialist:
			return [...]string{"Akademia Sztuki " + place + "iej", "Akademia Muzyczna " + fem, "Akademia Medyczna " + fem, "Akademia Rolnicza " + fem, "Akademia Handlowa " + fem}[sp], "Akad. " + fem
		}
	case styleLusmaran:
		switch m {
		case missionResearch, missionComprehensive:
			return "Universidade de " + place, place
		case missionTechnical:
			return "Universidade Técnica de " + place, "UT " + place
		case missionTeaching:
			return pick(r, []string{"Instituto Superior de " + place, "Escola Superior de " + place}), place
		case missionSpecialist:
			return [...]string{"Escola Superior de Artes de " + place, "Conservatório de " + place, "Escola de Enfermagem de " + place, "Escola Agrária de " + place, "Escola de Negócios de " + place}[sp], place
		}
	}
	return place, short
}

// elide writes French "de" before a place, as "d'" before a vowel.
func elide(de, place string) string {
	first, _ := utf8.DecodeRuneInString(place)
	if strings.ContainsRune("AEIOUYÉÈÊÂÎÔÛ", unicode.ToUpper(first)) {
		return "d'" + place
	}
	return de + " " + place
}

package demo

import _ "embed"

//go:embed indicators.yaml
var dictionaryYAML []byte

//go:embed brief.md
var briefMD []byte

// generate builds every scenario file from the seed. Each part draws from
// its own stream (rng.go), so the parts do not disturb one another.
func generate(seed uint64) map[string][]byte {
	insts := generateInstitutions(seed)
	ppp := generatePPP(seed)
	vals := generateValues(seed, insts, ppp)
	// The vote records are drawn before the values file is written: the
	// last year's peer_esteem is computed from them.
	votes, weighted := votesCSV(seed, insts, vals)
	esteemFromVotes(vals, weighted)
	return map[string][]byte{
		BriefName:      briefMD,
		RegisterName:   registerCSV(insts),
		DictionaryName: dictionaryYAML,
		ValuesName:     longCSV(insts, vals),
		WideValuesName: wideCSV(insts, vals),
		PPPName:        pppCSV(ppp),
		PapersName:     papersCSV(seed, insts, vals),
		VotesName:      votes,
		TargetsName:    targetsCSV(insts, vals),
		LogoName:       logoPNG(),
	}
}

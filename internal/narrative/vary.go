package narrative

import "hash/fnv"

// variant picks one of n phrasings for a sentence from the figure key it
// is about, so that a pack reads varied but the same inputs always give
// the same words (no randomness: packs must be reproducible byte for
// byte). The key is hashed with FNV-1a (stable across Go releases) and
// the hash finished with MurmurHash3's fmix32 avalanche step (Appleby,
// MurmurHash3, public domain), because FNV-1a's low bits mix poorly: its
// lowest bit is only the parity of the key's bytes, so choices between two
// phrasings would all move together.
func variant(seed string, n int) int {
	if n <= 1 {
		return 0
	}
	h := fnv.New32a()
	h.Write([]byte(seed))
	return int(fmix32(h.Sum32()) % uint32(n))
}

func fmix32(h uint32) uint32 {
	h ^= h >> 16
	h *= 0x85ebca6b
	h ^= h >> 13
	h *= 0xc2b2ae35
	h ^= h >> 16
	return h
}

// rotate picks phrasing turn of a series: consecutive turns take
// consecutive phrasings, from a start the seed chooses.
func rotate(seed string, turn, n int) int {
	if n <= 1 {
		return 0
	}
	return (variant(seed, n) + turn) % n
}

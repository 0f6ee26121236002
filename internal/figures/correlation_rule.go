package figures

// MinCorrelationPairs is the fewest institutions with both values before
// a pack may say that two indicators move together, or draw a line
// through them: with fewer than ten pairs a coefficient is too unstable
// to read (common practice, no source; the 95% interval of Pearson's r
// at n = 10 and r = 0.5 runs from about -0.19 to 0.86 by Fisher's z).
// The figures file still carries n, pearson and spearman for every pair,
// so a reader can see what was left unsaid.
const MinCorrelationPairs = 10

// Enough reports whether the correlation rests on at least
// MinCorrelationPairs institutions.
func (c Correlation) Enough() bool { return c.N >= MinCorrelationPairs }

package derive

import (
	"sort"
	"strings"
)

// CycleError names a chain of derived indicators that depend on each
// other; Path starts and ends with the same key ("a -> b -> a").
type CycleError struct {
	Path []string
}

func (e *CycleError) Error() string {
	return "derived indicators depend on each other in a cycle: " + strings.Join(e.Path, " -> ") + "; one of them must be read from the values instead"
}

// Order returns the keys of defs in an order where every derived key comes
// after the derived keys it reads (a depth-first topological sort, Tarjan
// 1976). Names that are not keys of defs are inputs and impose no order.
// Ties keep the order of keys as given.
func Order(keys []string, defs map[string]*Expr) ([]string, error) {
	const (
		white = iota
		grey
		black
	)
	state := map[string]int{}
	var out, stack []string
	var visit func(k string) error
	visit = func(k string) error {
		switch state[k] {
		case black:
			return nil
		case grey:
			i := len(stack) - 1
			for i >= 0 && stack[i] != k {
				i--
			}
			path := append(append([]string(nil), stack[i:]...), k)
			return &CycleError{Path: path}
		}
		state[k] = grey
		stack = append(stack, k)
		for _, r := range defs[k].Refs() {
			if _, ok := defs[r]; ok {
				if err := visit(r); err != nil {
					return err
				}
			}
		}
		stack = stack[:len(stack)-1]
		state[k] = black
		out = append(out, k)
		return nil
	}
	ordered := make([]string, 0, len(defs))
	seen := map[string]bool{}
	for _, k := range keys {
		if _, ok := defs[k]; ok && !seen[k] {
			ordered = append(ordered, k)
			seen[k] = true
		}
	}
	var rest []string
	for k := range defs {
		if !seen[k] {
			rest = append(rest, k)
		}
	}
	sort.Strings(rest)
	for _, k := range append(ordered, rest...) {
		if err := visit(k); err != nil {
			return nil, err
		}
	}
	return out, nil
}

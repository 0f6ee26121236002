package derive

import (
	"math"
)

// Outcome says why an evaluation gave no value.
type Outcome int

// Outcomes of Eval.
const (
	OK Outcome = iota
	// MissingInput: an input the expression reads was missing.
	MissingInput
	// DivideByZero: a divisor was zero (or the result overflowed).
	DivideByZero
)

// Eval computes the expression with lookup giving each name's value (NaN
// for missing). The result is NaN, never an infinity, when the outcome is
// not OK. Missing input takes precedence over division by zero, since it
// is what the user fixes first.
func (e *Expr) Eval(lookup func(name string) float64) (float64, Outcome) {
	out := OK
	v := eval(e.Root, lookup, &out)
	if out != OK {
		return math.NaN(), out
	}
	if math.IsNaN(v) || math.IsInf(v, 0) {
		return math.NaN(), DivideByZero
	}
	return v, OK
}

func eval(n Node, lookup func(string) float64, out *Outcome) float64 {
	switch v := n.(type) {
	case *Num:
		return v.Value
	case *Ref:
		x := lookup(v.Name)
		if math.IsNaN(x) {
			*out = MissingInput
		}
		return x
	case *Neg:
		return -eval(v.X, lookup, out)
	case *Binary:
		x := eval(v.X, lookup, out)
		y := eval(v.Y, lookup, out)
		switch v.Op {
		case Add:
			return x + y
		case Sub:
			return x - y
		case Mul:
			return x * y
		case Div:
			if y == 0 {
				if *out == OK {
					*out = DivideByZero
				}
				return math.NaN()
			}
			return x / y
		}
	}
	return math.NaN()
}

package narrative

import (
	"fmt"
	"math"
	"strconv"

	"peerpack/internal/figures"
)

// Claims: what a sentence asserts, recorded beside what it cites.
//
// A sentence that compares, ranks, counts or qualifies ("top quarter",
// "ahead", "none", "largest", "broadly unchanged") carries one Claim per
// comparison it makes: "none of the five systems is ahead on any other
// indicator" is one claim per system and indicator, "top quarter on A, B
// and C" one per indicator. A claim compares two operands, each a figure
// of the model or a number; a quantity a claim needs (a difference, an
// absolute change, a count) is a figure of the model with its own key,
// never arithmetic inside the claim, so a reader can re-check every claim
// from the figures file alone. Verify evaluates every claim, and a false
// one fails the build exactly as an untraceable number does.
//
// The planners decide what to say from the same comparisons they record,
// so wording follows the claims that hold, never the other way round.

// Comparison operators a claim may use.
const (
	OpLess      = "<"
	OpLessEq    = "<="
	OpEqual     = "="
	OpGreaterEq = ">="
	OpGreater   = ">"
	OpNotEqual  = "!="
)

// Operand is one side of a claim: a figure of the model (Key) or a plain
// number (IsNum).
type Operand struct {
	Key   figures.Key
	Num   float64
	IsNum bool
}

// Fig is an operand naming a figure of the model.
func Fig(k figures.Key) Operand { return Operand{Key: k} }

// Num is an operand holding a number (a method threshold, a value the
// sentence states).
func Num(v float64) Operand { return Operand{Num: v, IsNum: true} }

// Claim is one comparison a sentence makes: Left Op Right.
type Claim struct {
	Left  Operand
	Op    string
	Right Operand
}

// Claimed builds a claim.
func Claimed(left Operand, op string, right Operand) Claim {
	return Claim{Left: left, Op: op, Right: right}
}

// value looks an operand up in the model.
func (o Operand) value(m *figures.Model) (float64, error) {
	if o.IsNum {
		return o.Num, nil
	}
	r, ok := m.Lookup(o.Key)
	if !ok {
		return 0, fmt.Errorf("the figures model has no figure %s", o.Key)
	}
	if r.IsText {
		return 0, fmt.Errorf("the figure %s is a text, not a number", o.Key)
	}
	return r.Value, nil
}

// Holds evaluates the claim against the model. An operand the model lacks
// or a text figure is an error; so is an operator outside the six.
func (c Claim) Holds(m *figures.Model) (bool, error) {
	l, err := c.Left.value(m)
	if err != nil {
		return false, err
	}
	r, err := c.Right.value(m)
	if err != nil {
		return false, err
	}
	if math.IsNaN(l) || math.IsNaN(r) {
		return false, nil
	}
	switch c.Op {
	case OpLess:
		return l < r, nil
	case OpLessEq:
		return l <= r, nil
	case OpEqual:
		return l == r, nil
	case OpGreaterEq:
		return l >= r, nil
	case OpGreater:
		return l > r, nil
	case OpNotEqual:
		return l != r, nil
	}
	return false, fmt.Errorf("unknown comparison %q", c.Op)
}

// text writes the claim as the figures file's claim row does: "LEFT OP
// RIGHT", each side a number in its shortest exact form, "cites.NNN" when
// the figure is one of the sentence's citations, else the figure's key
// written as cites rows write it.
func (c Claim) text(cites []figures.Key) string {
	return operandText(c.Left, cites) + " " + c.Op + " " + operandText(c.Right, cites)
}

func operandText(o Operand, cites []figures.Key) string {
	if o.IsNum {
		return strconv.FormatFloat(o.Num, 'g', -1, 64)
	}
	for i, k := range cites {
		if k == o.Key {
			return citeMeasure(i + 1)
		}
	}
	return o.Key.String()
}

func citeMeasure(n int) string { return fmt.Sprintf("cites.%03d", n) }

func claimMeasure(n int) string { return fmt.Sprintf("claim.%03d", n) }

// String is the claim with full keys, for messages.
func (c Claim) String() string { return c.text(nil) }

// verifyClaims evaluates every claim of a sentence and describes each
// that does not hold.
func verifyClaims(m *figures.Model, s Sentence) []error {
	var out []error
	for i, cl := range s.Claims {
		ok, err := cl.Holds(m)
		switch {
		case err != nil:
			out = append(out, fmt.Errorf("commentary (%s): the sentence %q makes claim %d (%s), which cannot be evaluated: %v", s.Part, s.Text, i+1, cl, err))
		case !ok:
			l, _ := cl.Left.value(m)
			r, _ := cl.Right.value(m)
			out = append(out, fmt.Errorf("commentary (%s): the sentence %q claims %s, which is false (%s %s %s)", s.Part, s.Text, cl,
				strconv.FormatFloat(l, 'g', -1, 64), cl.Op, strconv.FormatFloat(r, 'g', -1, 64)))
		}
	}
	return out
}

// claim adds claims to a sentence and returns it.
func (s Sentence) claim(cs ...Claim) Sentence {
	s.Claims = append(s.Claims, cs...)
	return s
}

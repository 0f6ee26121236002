package derive

import (
	"fmt"
	"strconv"
	"strings"
)

// Op is an arithmetic operator.
type Op byte

// The operators.
const (
	Add Op = '+'
	Sub Op = '-'
	Mul Op = '*'
	Div Op = '/'
)

// Node is a parsed expression.
type Node interface {
	// Col is where the node starts in the source, 1-based.
	Col() int
	String() string
}

// Num is a number literal.
type Num struct {
	Value float64
	At    int
}

// Ref is a reference to an indicator key or a register attribute.
type Ref struct {
	Name string
	At   int
}

// Neg is unary minus.
type Neg struct {
	X  Node
	At int
}

// Binary is X Op Y.
type Binary struct {
	Op   Op
	X, Y Node
	At   int
}

// Col implements Node.
func (n *Num) Col() int { return n.At }

// Col implements Node.
func (n *Ref) Col() int { return n.At }

// Col implements Node.
func (n *Neg) Col() int { return n.At }

// Col implements Node.
func (n *Binary) Col() int { return n.At }

func (n *Num) String() string { return strconv.FormatFloat(n.Value, 'g', -1, 64) }
func (n *Ref) String() string { return n.Name }
func (n *Neg) String() string {
	if _, ok := n.X.(*Binary); ok {
		return "-(" + n.X.String() + ")"
	}
	return "-" + n.X.String()
}

// String prints the expression with only the parentheses its tree needs:
// a left operand of lower precedence, a right operand of lower or equal
// precedence (so a - (b - c) and a * (b * c) keep their grouping, which
// floating point can tell apart). A long chain such as a * b * c * ... is
// printed flat, so printing never nests deeper than the source did.
func (n *Binary) String() string {
	x, y := n.X.String(), n.Y.String()
	if b, ok := n.X.(*Binary); ok && precedence(b.Op) < precedence(n.Op) {
		x = "(" + x + ")"
	}
	if b, ok := n.Y.(*Binary); ok && precedence(b.Op) <= precedence(n.Op) {
		y = "(" + y + ")"
	}
	return x + " " + string(n.Op) + " " + y
}

func precedence(op Op) int {
	switch string(op) {
	case "*", "/":
		return 2
	}
	return 1
}

// Expr is a parsed derive expression.
type Expr struct {
	Source string
	Root   Node
	// Percent is set by the "share of X in Y" form, whose result is a
	// percent; the dictionary checks the indicator's unit against it.
	Percent bool
}

// Refs returns the distinct names the expression reads, in first-use order.
func (e *Expr) Refs() []string {
	var out []string
	seen := map[string]bool{}
	var walk func(Node)
	walk = func(n Node) {
		switch v := n.(type) {
		case *Ref:
			if !seen[v.Name] {
				seen[v.Name] = true
				out = append(out, v.Name)
			}
		case *Neg:
			walk(v.X)
		case *Binary:
			walk(v.X)
			walk(v.Y)
		}
	}
	walk(e.Root)
	return out
}

// RefAt returns the column of the first use of name, or 0.
func (e *Expr) RefAt(name string) int {
	col := 0
	var walk func(Node)
	walk = func(n Node) {
		if col != 0 {
			return
		}
		switch v := n.(type) {
		case *Ref:
			if v.Name == name {
				col = v.At
			}
		case *Neg:
			walk(v.X)
		case *Binary:
			walk(v.X)
			walk(v.Y)
		}
	}
	walk(e.Root)
	return col
}

// Parse reads an expression. Errors are *Error with the column.
func Parse(src string) (*Expr, error) {
	if len(src) > MaxLength {
		return nil, &Error{1, fmt.Sprintf("the expression is %d characters long, over the limit of %d; split it into intermediate derived indicators", len(src), MaxLength)}
	}
	if strings.TrimSpace(src) == "" {
		return nil, &Error{1, "the expression is empty; write e.g. ratio of papers to academic_staff"}
	}
	toks, err := lex(src)
	if err != nil {
		return nil, err
	}
	p := &parser{toks: toks}
	root, err := p.expr(0)
	if err != nil {
		return nil, err
	}
	if t := p.peek(); t.kind != tEOF {
		return nil, &Error{t.col, fmt.Sprintf("unexpected %s after a complete expression; join terms with + - * / or per", describe(t))}
	}
	return &Expr{Source: src, Root: root, Percent: p.percent}, nil
}

type parser struct {
	toks    []token
	i       int
	percent bool
}

func (p *parser) peek() token { return p.toks[p.i] }
func (p *parser) peek2() token {
	if p.i+1 < len(p.toks) {
		return p.toks[p.i+1]
	}
	return p.toks[len(p.toks)-1]
}
func (p *parser) next() token {
	t := p.toks[p.i]
	if p.i < len(p.toks)-1 {
		p.i++
	}
	return t
}

func describe(t token) string {
	switch t.kind {
	case tEOF:
		return "end of expression"
	case tNum:
		return "number " + t.text
	case tIdent:
		return fmt.Sprintf("%q", t.text)
	}
	return fmt.Sprintf("%q", t.text)
}

func (p *parser) word(w string) bool {
	t := p.peek()
	return t.kind == tIdent && t.text == w
}

func (p *parser) expect(w string, form string) error {
	if !p.word(w) {
		t := p.peek()
		return &Error{t.col, fmt.Sprintf("expected %q in %q, found %s; for example: %s", w, form, describe(t), formExample(form))}
	}
	p.next()
	return nil
}

func (p *parser) expr(depth int) (Node, error) {
	if depth > MaxDepth {
		return nil, &Error{p.peek().col, fmt.Sprintf("the expression nests deeper than %d levels; remove parentheses or split it into intermediate derived indicators", MaxDepth)}
	}
	t := p.peek()
	if t.kind == tIdent && p.peek2().kind == tIdent && p.peek2().text == "of" {
		switch t.text {
		case "ratio":
			p.next()
			p.next()
			x, err := p.sum(depth + 1)
			if err != nil {
				return nil, err
			}
			if err := p.expect("to", "ratio of X to Y"); err != nil {
				return nil, err
			}
			y, err := p.sum(depth + 1)
			if err != nil {
				return nil, err
			}
			return &Binary{Div, x, y, t.col}, nil
		case "share":
			p.next()
			p.next()
			x, err := p.sum(depth + 1)
			if err != nil {
				return nil, err
			}
			if err := p.expect("in", "share of X in Y"); err != nil {
				return nil, err
			}
			y, err := p.sum(depth + 1)
			if err != nil {
				return nil, err
			}
			if depth == 0 {
				p.percent = true
			}
			return &Binary{Mul, &Binary{Div, x, y, t.col}, &Num{100, t.col}, t.col}, nil
		case "sum":
			p.next()
			p.next()
			x, err := p.sum(depth + 1)
			if err != nil {
				return nil, err
			}
			n := 1
			for p.peek().kind == tOp && p.peek().text == "," {
				p.next()
				y, err := p.sum(depth + 1)
				if err != nil {
					return nil, err
				}
				x = &Binary{Add, x, y, t.col}
				n++
			}
			if n < 2 {
				return nil, &Error{p.peek().col, "sum of needs at least two terms separated by commas, e.g. sum of a, b, c"}
			}
			return x, nil
		case "difference":
			p.next()
			p.next()
			x, err := p.sum(depth + 1)
			if err != nil {
				return nil, err
			}
			if err := p.expect("and", "difference of X and Y"); err != nil {
				return nil, err
			}
			y, err := p.sum(depth + 1)
			if err != nil {
				return nil, err
			}
			return &Binary{Sub, x, y, t.col}, nil
		}
	}
	x, err := p.sum(depth + 1)
	if err != nil {
		return nil, err
	}
	if p.word("per") {
		at := p.next().col
		y, err := p.sum(depth + 1)
		if err != nil {
			return nil, err
		}
		return &Binary{Div, x, y, at}, nil
	}
	return x, nil
}

func (p *parser) sum(depth int) (Node, error) {
	x, err := p.product(depth)
	if err != nil {
		return nil, err
	}
	for {
		t := p.peek()
		if t.kind != tOp || (t.text != "+" && t.text != "-") {
			return x, nil
		}
		p.next()
		y, err := p.product(depth)
		if err != nil {
			return nil, err
		}
		x = &Binary{Op(t.text[0]), x, y, t.col}
	}
}

func (p *parser) product(depth int) (Node, error) {
	x, err := p.unary(depth)
	if err != nil {
		return nil, err
	}
	for {
		t := p.peek()
		if t.kind != tOp || (t.text != "*" && t.text != "/") {
			return x, nil
		}
		p.next()
		y, err := p.unary(depth)
		if err != nil {
			return nil, err
		}
		x = &Binary{Op(t.text[0]), x, y, t.col}
	}
}

func (p *parser) unary(depth int) (Node, error) {
	if depth > MaxDepth {
		return nil, &Error{p.peek().col, fmt.Sprintf("the expression nests deeper than %d levels; remove parentheses or split it into intermediate derived indicators", MaxDepth)}
	}
	t := p.peek()
	if t.kind == tOp && t.text == "-" {
		p.next()
		x, err := p.unary(depth + 1)
		if err != nil {
			return nil, err
		}
		return &Neg{x, t.col}, nil
	}
	return p.primary(depth)
}

func (p *parser) primary(depth int) (Node, error) {
	t := p.next()
	switch t.kind {
	case tNum:
		v, err := strconv.ParseFloat(t.text, 64)
		if err != nil {
			return nil, &Error{t.col, fmt.Sprintf("number %s is too large to compute with (the most is about 1.8e308); check the digits", t.text)}
		}
		return &Num{v, t.col}, nil
	case tIdent:
		if IsReserved(t.text) {
			return nil, &Error{t.col, fmt.Sprintf("%q is a connecting word (%s), not a key; check the form, e.g. ratio of X to Y, share of X in Y, X per Y", t.text, strings.Join(Reserved, ", "))}
		}
		return &Ref{t.text, t.col}, nil
	case tOp:
		if t.text == "(" {
			x, err := p.expr(depth + 1)
			if err != nil {
				return nil, err
			}
			c := p.next()
			if c.kind != tOp || c.text != ")" {
				return nil, &Error{c.col, fmt.Sprintf("expected \")\" to close the parenthesis at column %d, found %s", t.col, describe(c))}
			}
			return x, nil
		}
	}
	return nil, &Error{t.col, fmt.Sprintf("expected a number, a key or \"(\", found %s", describe(t))}
}

// formExample shows a connective form with real keys, for messages.
func formExample(form string) string {
	switch {
	case strings.HasPrefix(form, "ratio of"):
		return "ratio of papers to academic_staff"
	case strings.HasPrefix(form, "share of"):
		return "share of research_income in total_income"
	case strings.HasPrefix(form, "difference of"):
		return "difference of income and spending"
	}
	return form
}

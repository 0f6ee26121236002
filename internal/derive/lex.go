// Package derive is the small expression language of the dictionary's
// derive: field, in which an indicator is computed from other indicators
// and from numeric register attributes.
//
// Grammar (words in quotes are written as shown; keys are indicator keys or
// register attribute names, letters, digits and underscores):
//
//	expr    = "ratio" "of" sum "to" sum          -> X / Y
//	        | "share" "of" sum "in" sum          -> X / Y * 100 (a percent)
//	        | "sum" "of" sum { "," sum }         -> X + Y + ...
//	        | "difference" "of" sum "and" sum    -> X - Y
//	        | sum [ "per" sum ]                  -> X / Y
//	sum     = product { ("+" | "-") product }
//	product = unary { ("*" | "/") unary }
//	unary   = "-" unary | primary
//	primary = number | key | "(" expr ")"
//
// The words ratio, share, sum and difference start a form only when "of"
// follows them, so they remain usable as keys; of, to, in, and and per are
// reserved. Evaluation gives NaN ("missing") when an input is missing or a
// divisor is zero, never an infinity, and says which happened so the check
// summary can count them.
package derive

import (
	"fmt"
)

// Limits that keep a hostile expression from using unbounded time or
// stack.
const (
	MaxLength = 2000
	MaxDepth  = 64
)

// Reserved are the connecting words of the sugar forms; they cannot be
// keys.
var Reserved = []string{"of", "to", "in", "and", "per"}

// IsReserved reports whether a key would be read as a connecting word.
func IsReserved(key string) bool {
	for _, r := range Reserved {
		if r == key {
			return true
		}
	}
	return false
}

// Error is a problem in an expression at a 1-based character column.
type Error struct {
	Col int
	Msg string
}

func (e *Error) Error() string { return fmt.Sprintf("column %d: %s", e.Col, e.Msg) }

type tokKind int

const (
	tEOF tokKind = iota
	tNum
	tIdent
	tOp // + - * / ( ) ,
)

type token struct {
	kind tokKind
	text string
	col  int
}

func isLetter(c byte) bool { return c == '_' || (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') }
func isDigit(c byte) bool  { return c >= '0' && c <= '9' }

func lex(src string) ([]token, error) {
	var out []token
	col := 1
	for i := 0; i < len(src); {
		c := src[i]
		switch {
		case c == ' ' || c == '\t' || c == '\n' || c == '\r':
			i++
			col++
		case isLetter(c):
			j := i
			for j < len(src) && (isLetter(src[j]) || isDigit(src[j])) {
				j++
			}
			out = append(out, token{tIdent, src[i:j], col})
			col += j - i
			i = j
		case isDigit(c) || (c == '.' && i+1 < len(src) && isDigit(src[i+1])):
			j := i
			for j < len(src) && isDigit(src[j]) {
				j++
			}
			if j < len(src) && src[j] == '.' {
				j++
				for j < len(src) && isDigit(src[j]) {
					j++
				}
			}
			if j < len(src) && (src[j] == 'e' || src[j] == 'E') {
				k := j + 1
				if k < len(src) && (src[k] == '+' || src[k] == '-') {
					k++
				}
				if k < len(src) && isDigit(src[k]) {
					for k < len(src) && isDigit(src[k]) {
						k++
					}
					j = k
				}
			}
			if j < len(src) && isLetter(src[j]) {
				return nil, &Error{col, fmt.Sprintf("%q: a key cannot start with a digit, and a number needs an operator before a key (write 100 * x)", src[i:j+1])}
			}
			out = append(out, token{tNum, src[i:j], col})
			col += j - i
			i = j
		case c == '+' || c == '-' || c == '*' || c == '/' || c == '(' || c == ')' || c == ',':
			out = append(out, token{tOp, string(c), col})
			i++
			col++
		case c == '%':
			return nil, &Error{col, "% is not an operator here; for a percentage write share of X in Y, or X / Y * 100"}
		case c == ';':
			return nil, &Error{col, "unexpected \";\"; the terms of sum of are separated by commas"}
		default:
			r := []rune(src[i:])[0]
			return nil, &Error{col, fmt.Sprintf("unexpected character %q; expressions use keys, numbers, + - * / and parentheses", r)}
		}
	}
	out = append(out, token{tEOF, "", col})
	return out, nil
}

package scan

import (
	"fmt"
	"math"
	"slices"
	"strconv"
	"strings"
	"unicode"
)

// Formula is an arithmetic expression of the slice parameters, such as a
// closed-form next-order coefficient to compare a scan with:
//
//	-pi/(2*gamma*v)
//	-gamma*v*3*pi/4*(5*gamma^2 - 1)/(gamma^2 - 1)
//
// Grammar (usual precedence; ^ is the power, right-associative and above
// unary minus, so -x^2 = −(x²)):
//
//	expr    = term {("+" | "-") term}
//	term    = unary {("*" | "/") unary}
//	unary   = ("+" | "-") unary | power
//	power   = primary ["^" unary]
//	primary = number | name | name "(" expr {"," expr} ")" | "(" expr ")"
//
// Names: pi, the variables gamma, v and b of each slice, and the name of
// every parameter axis; functions sqrt, exp, log, sin, cos, tan, asin,
// acos, atan, sinh, cosh, tanh, abs and pow(x, y).
type Formula struct {
	Text string
	root node
}

type node func(vars map[string]float64) (float64, error)

// ParseFormula parses a formula; names are checked when it is evaluated.
func ParseFormula(text string) (*Formula, error) {
	p := &formulaParser{text: text}
	p.next()
	root, err := p.expr()
	if err == nil && p.tok != "" {
		err = fmt.Errorf("unexpected %q", p.tok)
	}
	if err != nil {
		return nil, fmt.Errorf("formula %q: %v", text, err)
	}
	return &Formula{Text: text, root: root}, nil
}

// Eval evaluates the formula with the given variables.
func (f *Formula) Eval(vars map[string]float64) (float64, error) {
	x, err := f.root(vars)
	if err != nil {
		return 0, fmt.Errorf("formula %q: %v", f.Text, err)
	}
	return x, nil
}

type formulaParser struct {
	text string
	pos  int
	tok  string // current token ("" at the end)
}

// next reads the next token: a number, a name or one operator character.
func (p *formulaParser) next() {
	for p.pos < len(p.text) && p.text[p.pos] == ' ' {
		p.pos++
	}
	if p.pos >= len(p.text) {
		p.tok = ""
		return
	}
	start := p.pos
	c := rune(p.text[p.pos])
	switch {
	case unicode.IsDigit(c) || c == '.':
		for p.pos < len(p.text) {
			c := p.text[p.pos]
			exp := (c == '+' || c == '-') && p.pos > start && (p.text[p.pos-1] == 'e' || p.text[p.pos-1] == 'E')
			if !(c >= '0' && c <= '9' || c == '.' || c == 'e' || c == 'E' || exp) {
				break
			}
			p.pos++
		}
	case unicode.IsLetter(c) || c == '_':
		for p.pos < len(p.text) && (unicode.IsLetter(rune(p.text[p.pos])) || unicode.IsDigit(rune(p.text[p.pos])) || p.text[p.pos] == '_') {
			p.pos++
		}
	default:
		p.pos++
	}
	p.tok = p.text[start:p.pos]
}

func binary(op string, x, y node) node {
	return func(v map[string]float64) (float64, error) {
		a, err := x(v)
		if err != nil {
			return 0, err
		}
		b, err := y(v)
		if err != nil {
			return 0, err
		}
		switch op {
		case "+":
			return a + b, nil
		case "-":
			return a - b, nil
		case "*":
			return a * b, nil
		case "/":
			return a / b, nil
		}
		return math.Pow(a, b), nil
	}
}

func (p *formulaParser) expr() (node, error) {
	x, err := p.term()
	for err == nil && (p.tok == "+" || p.tok == "-") {
		op := p.tok
		p.next()
		var y node
		if y, err = p.term(); err == nil {
			x = binary(op, x, y)
		}
	}
	return x, err
}

func (p *formulaParser) term() (node, error) {
	x, err := p.unary()
	for err == nil && (p.tok == "*" || p.tok == "/") {
		op := p.tok
		p.next()
		var y node
		if y, err = p.unary(); err == nil {
			x = binary(op, x, y)
		}
	}
	return x, err
}

func (p *formulaParser) unary() (node, error) {
	if p.tok == "-" || p.tok == "+" {
		neg := p.tok == "-"
		p.next()
		x, err := p.unary()
		if err != nil || !neg {
			return x, err
		}
		return func(v map[string]float64) (float64, error) {
			a, err := x(v)
			return -a, err
		}, nil
	}
	x, err := p.primary()
	if err != nil || p.tok != "^" {
		return x, err
	}
	p.next()
	y, err := p.unary()
	if err != nil {
		return nil, err
	}
	return binary("^", x, y), nil
}

func (p *formulaParser) primary() (node, error) {
	tok := p.tok
	switch {
	case tok == "":
		return nil, fmt.Errorf("unexpected end")
	case tok == "(":
		p.next()
		x, err := p.expr()
		if err != nil {
			return nil, err
		}
		if p.tok != ")" {
			return nil, fmt.Errorf("missing )")
		}
		p.next()
		return x, nil
	case unicode.IsDigit(rune(tok[0])) || tok[0] == '.':
		x, err := strconv.ParseFloat(tok, 64)
		if err != nil {
			return nil, fmt.Errorf("%q is not a number", tok)
		}
		p.next()
		return func(map[string]float64) (float64, error) { return x, nil }, nil
	case unicode.IsLetter(rune(tok[0])) || tok[0] == '_':
		p.next()
		if p.tok != "(" {
			if tok == "pi" {
				return func(map[string]float64) (float64, error) { return math.Pi, nil }, nil
			}
			return func(v map[string]float64) (float64, error) {
				if x, ok := v[tok]; ok {
					return x, nil
				}
				return 0, fmt.Errorf("unknown name %s (have pi and %s)", tok, names(v))
			}, nil
		}
		p.next()
		var args []node
		for {
			a, err := p.expr()
			if err != nil {
				return nil, err
			}
			args = append(args, a)
			if p.tok == "," {
				p.next()
				continue
			}
			if p.tok != ")" {
				return nil, fmt.Errorf("missing ) after the arguments of %s", tok)
			}
			p.next()
			break
		}
		if tok == "pow" && len(args) == 2 {
			return binary("^", args[0], args[1]), nil
		}
		fn, ok := functions[tok]
		if !ok || len(args) != 1 {
			return nil, fmt.Errorf("unknown function %s of %d arguments", tok, len(args))
		}
		return func(v map[string]float64) (float64, error) {
			a, err := args[0](v)
			return fn(a), err
		}, nil
	}
	return nil, fmt.Errorf("unexpected %q", tok)
}

func names(v map[string]float64) string {
	var n []string
	for k := range v {
		n = append(n, k)
	}
	slices.Sort(n)
	return strings.Join(n, ", ")
}

var functions = map[string]func(float64) float64{
	"sqrt": math.Sqrt, "exp": math.Exp, "log": math.Log, "sin": math.Sin, "cos": math.Cos, "tan": math.Tan,
	"asin": math.Asin, "acos": math.Acos, "atan": math.Atan, "sinh": math.Sinh, "cosh": math.Cosh, "tanh": math.Tanh,
	"abs": math.Abs,
}

package predict

import (
	"errors"
	"fmt"
	"math"
	"math/cmplx"
	"strings"
	"unicode/utf8"

	"github.com/expr-lang/expr/ast"
	"github.com/expr-lang/expr/file"
	"github.com/expr-lang/expr/parser"
)

// Limits of the formula language. A compiled formula is a tree of
// closures, one per node of the syntax tree, and an evaluation runs each
// at most once (the language has no loops, no recursion, no collections
// and no strings; a let binding is evaluated once), so these bound the
// time and memory of an evaluation.
const (
	// MaxFormulaLen is the longest formula accepted, in bytes.
	MaxFormulaLen = 4096
	// MaxFormulaNodes is the largest syntax tree accepted.
	MaxFormulaNodes = 2000
)

// Formula is a compiled prediction formula.
type Formula struct {
	Name   string // what it predicts (for messages)
	Source string
	root   node
	nodes  int // size of the syntax tree
	slots  [2]int
}

// Nodes is the size of the formula's syntax tree: an evaluation executes
// at most this many operations.
func (f *Formula) Nodes() int { return f.nodes }

// Compile parses and type-checks a formula whose value is a scalar. name
// labels errors. A bad formula returns a one-line error naming the column
// of the fault and the text from there on.
//
// The expression library (github.com/expr-lang/expr) parses the text;
// its syntax tree is then compiled here into typed closures over complex
// scalars and complex 3-vectors, because the library's own virtual machine
// has no complex numbers and its operator overloading does not carry the
// types of let-bound values.
func Compile(name, src string) (*Formula, error) {
	if len(src) > MaxFormulaLen {
		return nil, fmt.Errorf("predict: %s: formula of %d bytes; allowed: at most %d", name, len(src), MaxFormulaLen)
	}
	if !utf8.ValidString(src) {
		return nil, fmt.Errorf("predict: %s: formula is not valid UTF-8", name)
	}
	if strings.TrimSpace(src) == "" {
		return nil, fmt.Errorf("predict: %s: empty formula", name)
	}
	tree, err := parser.Parse(src)
	if err != nil {
		return nil, formulaError(name, src, err)
	}
	c := &compiler{}
	root, err := c.compile(tree.Node, map[string]binding{})
	if err != nil {
		return nil, formulaError(name, src, err)
	}
	if root.kind != scalarKind {
		return nil, formulaError(name, src, syntaxError{0, "the value is a vector; a prediction is a scalar (take a component such as dot(u, bhat) or u.z)"})
	}
	return &Formula{Name: name, Source: src, root: root, nodes: c.nodes, slots: c.slots}, nil
}

// Eval returns the formula's value at q. mirror reverses the orientation
// of cross products and n̂ (used by the convention catalogue).
func (f *Formula) Eval(q Quantities, mirror bool) (complex128, error) {
	z, _ := f.eval(q, mirror)
	return z, nil
}

// eval returns the value and the number of operations executed.
func (f *Formula) eval(q Quantities, mirror bool) (complex128, int) {
	e := newEnv(q, mirror)
	e.sslots = make([]complex128, f.slots[0])
	e.vslots = make([]vector, f.slots[1])
	z := f.root.s(e)
	return z, e.steps
}

// Real returns the real value of the formula at q: an error when the value
// is not finite or has an imaginary part above 1e-9 of its modulus (wrap a
// complex expression in re(...) to take its real part).
func (f *Formula) Real(q Quantities, mirror bool) (float64, error) {
	z, err := f.Eval(q, mirror)
	if err != nil {
		return 0, err
	}
	if cmplx.IsNaN(z) || cmplx.IsInf(z) {
		return 0, fmt.Errorf("predict: %s: value %v is not finite at this configuration", f.Name, z)
	}
	// 1e-9: far above the rounding of any sensible formula, far below any
	// physical imaginary part.
	if math.Abs(imag(z)) > 1e-9*cmplx.Abs(z) {
		return 0, fmt.Errorf("predict: %s: value %.6g is complex; take re(...) or im(...) of it", f.Name, z)
	}
	return real(z), nil
}

// syntaxError is a fault found while compiling.
type syntaxError struct {
	from int // rune offset
	msg  string
}

func (e syntaxError) Error() string { return e.msg }

// formulaError turns a parser or compiler error into one line: the
// formula's name, the column and the rest of the formula from there.
func formulaError(name, src string, err error) error {
	col := -1
	msg := err.Error()
	var se syntaxError
	var fe *file.Error
	switch {
	case errors.As(err, &se):
		col = se.from
	case errors.As(err, &fe):
		col, msg = fe.From, fe.Message
	}
	if i := strings.IndexByte(msg, '\n'); i >= 0 {
		msg = msg[:i]
	}
	if col < 0 {
		return fmt.Errorf("predict: %s: %s", name, msg)
	}
	rs := []rune(src)
	if col > len(rs) {
		col = len(rs)
	}
	near := []rune(strings.ReplaceAll(string(rs[col:]), "\n", " "))
	at := "end of formula"
	if len(near) > 24 {
		at = fmt.Sprintf("%q", string(near[:24])+"…")
	} else if len(near) > 0 {
		at = fmt.Sprintf("%q", string(near))
	}
	return fmt.Errorf("predict: %s: column %d (at %s): %s", name, col+1, at, msg)
}

type kind int

const (
	scalarKind kind = iota
	vectorKind
)

func (k kind) String() string { return [...]string{"scalar", "vector"}[k] }

// node is a compiled subexpression: a scalar or a vector closure.
type node struct {
	kind kind
	s    func(*env) complex128
	v    func(*env) vector
}

func scalarNode(f func(*env) complex128) node {
	return node{kind: scalarKind, s: func(e *env) complex128 { e.steps++; return f(e) }}
}

func vectorNode(f func(*env) vector) node {
	return node{kind: vectorKind, v: func(e *env) vector { e.steps++; return f(e) }}
}

// binding is a let-bound name: its kind and slot.
type binding struct {
	kind kind
	slot int
}

// compiler turns the syntax tree into closures, admitting only the
// formula language: numbers, the named quantities and let-bound names,
// + − * / ^ ** and unary ±, calls of the listed functions, components
// .x .y .z and let bindings. Everything else the expression library
// parses (strings, arrays, maps, closures, pipes, comparisons,
// conditionals) is rejected with its position.
type compiler struct {
	nodes int
	slots [2]int
}

func (c *compiler) compile(n ast.Node, scope map[string]binding) (node, error) {
	c.nodes++
	bad := func(format string, a ...any) (node, error) {
		return node{}, syntaxError{n.Location().From, fmt.Sprintf(format, a...)}
	}
	if c.nodes > MaxFormulaNodes {
		return bad("formula too long: more than %d terms", MaxFormulaNodes)
	}
	switch x := n.(type) {
	case *ast.IntegerNode:
		z := complex(float64(x.Value), 0)
		return scalarNode(func(*env) complex128 { return z }), nil
	case *ast.FloatNode:
		z := complex(x.Value, 0)
		return scalarNode(func(*env) complex128 { return z }), nil
	case *ast.IdentifierNode:
		if b, ok := scope[x.Value]; ok {
			if b.kind == scalarKind {
				return scalarNode(func(e *env) complex128 { return e.sslots[b.slot] }), nil
			}
			return vectorNode(func(e *env) vector { return e.vslots[b.slot] }), nil
		}
		if f, ok := scalarQuantity[x.Value]; ok {
			return scalarNode(f), nil
		}
		if f, ok := vectorQuantity[x.Value]; ok {
			return vectorNode(f), nil
		}
		if _, ok := functionNames[x.Value]; ok {
			return bad("%s is a function: call it as %s(...)", x.Value, x.Value)
		}
		return bad("unknown name %s; known: %s", x.Value, strings.Join(sortedKeys(quantityNames), ", "))
	case *ast.UnaryNode:
		a, err := c.compile(x.Node, scope)
		if err != nil {
			return a, err
		}
		switch {
		case x.Operator == "+":
			return a, nil
		case x.Operator == "-" && a.kind == scalarKind:
			// 0 − z, not −z: the negation of a real number keeps a +0
			// imaginary part, so that sqrt(-4) is 2i, not −2i.
			return scalarNode(func(e *env) complex128 { return 0 - a.s(e) }), nil
		case x.Operator == "-":
			return vectorNode(func(e *env) vector { return vector{}.sub(a.v(e)) }), nil
		}
		return bad("operator %s is not part of the formula language", x.Operator)
	case *ast.BinaryNode:
		return c.binary(x, scope, bad)
	case *ast.CallNode:
		id, ok := x.Callee.(*ast.IdentifierNode)
		if !ok {
			return bad("only named functions can be called")
		}
		return c.call(id.Value, x.Arguments, scope, bad)
	case *ast.BuiltinNode:
		// Names the expression library reserves (abs, …) arrive here.
		if _, ok := functionNames[x.Name]; ok && x.Map == nil {
			return c.call(x.Name, x.Arguments, scope, bad)
		}
	case *ast.MemberNode:
		p, ok := x.Property.(*ast.StringNode)
		if !ok || x.Optional || x.Method || (p.Value != "x" && p.Value != "y" && p.Value != "z") {
			return bad("only the components .x, .y, .z of a vector can be taken")
		}
		a, err := c.compile(x.Node, scope)
		if err != nil {
			return a, err
		}
		if a.kind != vectorKind {
			return bad("component .%s of a scalar", p.Value)
		}
		switch p.Value {
		case "x":
			return scalarNode(func(e *env) complex128 { return a.v(e).X }), nil
		case "y":
			return scalarNode(func(e *env) complex128 { return a.v(e).Y }), nil
		}
		return scalarNode(func(e *env) complex128 { return a.v(e).Z }), nil
	case *ast.VariableDeclaratorNode:
		if _, ok := quantityNames[x.Name]; ok {
			return bad("let %s would hide the quantity %s", x.Name, x.Name)
		}
		if _, ok := functionNames[x.Name]; ok {
			return bad("let %s would hide the function %s", x.Name, x.Name)
		}
		val, err := c.compile(x.Value, scope)
		if err != nil {
			return val, err
		}
		b := binding{kind: val.kind, slot: c.slots[val.kind]}
		c.slots[val.kind]++
		inner := make(map[string]binding, len(scope)+1)
		for k, v := range scope {
			inner[k] = v
		}
		inner[x.Name] = b
		body, err := c.compile(x.Expr, inner)
		if err != nil {
			return body, err
		}
		set := func(e *env) {
			if b.kind == scalarKind {
				e.sslots[b.slot] = val.s(e)
			} else {
				e.vslots[b.slot] = val.v(e)
			}
		}
		if body.kind == scalarKind {
			return scalarNode(func(e *env) complex128 { set(e); return body.s(e) }), nil
		}
		return vectorNode(func(e *env) vector { set(e); return body.v(e) }), nil
	}
	kindName := strings.TrimSuffix(strings.TrimPrefix(fmt.Sprintf("%T", n), "*ast."), "Node")
	return bad("%s expressions are not part of the formula language", strings.ToLower(kindName))
}

func (c *compiler) binary(x *ast.BinaryNode, scope map[string]binding, bad func(string, ...any) (node, error)) (node, error) {
	switch x.Operator {
	case "+", "-", "*", "/", "^", "**":
	default:
		return bad("operator %s is not part of the formula language (allowed: + - * / ^)", x.Operator)
	}
	l, err := c.compile(x.Left, scope)
	if err != nil {
		return l, err
	}
	r, err := c.compile(x.Right, scope)
	if err != nil {
		return r, err
	}
	ss, vv := l.kind == scalarKind && r.kind == scalarKind, l.kind == vectorKind && r.kind == vectorKind
	switch op := x.Operator; {
	case op == "+" && ss:
		return scalarNode(func(e *env) complex128 { return l.s(e) + r.s(e) }), nil
	case op == "+" && vv:
		return vectorNode(func(e *env) vector { return l.v(e).add(r.v(e)) }), nil
	case op == "-" && ss:
		return scalarNode(func(e *env) complex128 { return l.s(e) - r.s(e) }), nil
	case op == "-" && vv:
		return vectorNode(func(e *env) vector { return l.v(e).sub(r.v(e)) }), nil
	case op == "*" && ss:
		return scalarNode(func(e *env) complex128 { return l.s(e) * r.s(e) }), nil
	case op == "*" && l.kind == scalarKind:
		return vectorNode(func(e *env) vector { return r.v(e).scale(l.s(e)) }), nil
	case op == "*" && r.kind == scalarKind:
		return vectorNode(func(e *env) vector { return l.v(e).scale(r.s(e)) }), nil
	case op == "*":
		return bad("vector * vector: use dot(u, w) or cross(u, w)")
	case op == "/" && ss:
		return scalarNode(func(e *env) complex128 { return l.s(e) / r.s(e) }), nil
	case op == "/" && r.kind == scalarKind:
		return vectorNode(func(e *env) vector { return l.v(e).scale(1 / r.s(e)) }), nil
	case (op == "^" || op == "**") && ss:
		return scalarNode(func(e *env) complex128 { return pow(l.s(e), r.s(e)) }), nil
	}
	return bad("operator %s is not defined for %s and %s", x.Operator, l.kind, r.kind)
}

func (c *compiler) call(name string, arguments []ast.Node, scope map[string]binding, bad func(string, ...any) (node, error)) (node, error) {
	if _, ok := functionNames[name]; !ok {
		return bad("unknown function %s; known: %s", name, strings.Join(sortedKeys(functionNames), ", "))
	}
	var args []node
	var kinds []string
	for _, a := range arguments {
		n, err := c.compile(a, scope)
		if err != nil {
			return n, err
		}
		args = append(args, n)
		kinds = append(kinds, n.kind.String())
	}
	want := func(ks ...kind) bool {
		if len(ks) != len(args) {
			return false
		}
		for i, k := range ks {
			if args[i].kind != k {
				return false
			}
		}
		return true
	}
	S, V := scalarKind, vectorKind
	if f, ok := scalarFuncs[name]; ok && want(S) {
		a := args[0]
		return scalarNode(func(e *env) complex128 { return f(a.s(e)) }), nil
	}
	if f, ok := vectorFuncs[name]; ok && want(V) {
		a := args[0]
		return vectorNode(func(e *env) vector { return f(a.v(e)) }), nil
	}
	switch {
	case name == "cross" && want(V, V):
		a, b := args[0], args[1]
		return vectorNode(func(e *env) vector {
			if e.Mirror {
				return b.v(e).cross(a.v(e))
			}
			return a.v(e).cross(b.v(e))
		}), nil
	case name == "dot" && want(V, V):
		a, b := args[0], args[1]
		return scalarNode(func(e *env) complex128 { return a.v(e).dot(b.v(e)) }), nil
	case name == "perp" && want(V):
		a := args[0]
		return vectorNode(func(e *env) vector { u := a.v(e); return u.sub(e.Lhat.scale(e.Lhat.dot(u))) }), nil
	case name == "norm" && want(V):
		a := args[0]
		return scalarNode(func(e *env) complex128 { u := a.v(e); return cmplx.Sqrt(u.dot(u)) }), nil
	case name == "unit" && want(V):
		a := args[0]
		return vectorNode(func(e *env) vector { u := a.v(e); return u.scale(1 / cmplx.Sqrt(u.dot(u))) }), nil
	case name == "vec" && want(S, S, S):
		a, b, d := args[0], args[1], args[2]
		return vectorNode(func(e *env) vector { return vector{a.s(e), b.s(e), d.s(e)} }), nil
	case name == "atan2" && want(S, S):
		a, b := args[0], args[1]
		return scalarNode(func(e *env) complex128 { return complex(math.Atan2(real(a.s(e)), real(b.s(e))), 0) }), nil
	}
	return bad("%s(%s): wrong arguments; %s", name, strings.Join(kinds, ", "), functionNames[name])
}

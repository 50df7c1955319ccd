package syntax

// Token is a lexical token kind.
type Token int

// The tokens of the language.
const (
	ILLEGAL Token = iota
	EOF
	NEWLINE // end of a statement outside brackets; also ';' is NOT a statement separator

	IDENT  // tau_m, µ, °C
	NUMBER // 20, 1.5e-3, .5
	STRING // "text"

	ADD // +
	SUB // -
	MUL // *
	QUO // /
	POW // ^

	EQL // ==
	NEQ // !=
	LSS // <
	LEQ // <=
	GTR // >
	GEQ // >=

	ASSIGN    // =
	LPAREN    // (
	RPAREN    // )
	LBRACK    // [
	RBRACK    // ]
	COMMA     // ,
	SEMICOLON // ; (separates variables from parameters in a formula head)
	PERIOD    // .

	// keywords
	AND
	OR
	NOT
	IN
	IF
	THEN
	ELSE
	TRUE
	FALSE
	FORMULA
)

var tokenNames = [...]string{
	ILLEGAL: "illegal character", EOF: "end of input", NEWLINE: "newline",
	IDENT: "name", NUMBER: "number", STRING: "string",
	ADD: "'+'", SUB: "'-'", MUL: "'*'", QUO: "'/'", POW: "'^'",
	EQL: "'=='", NEQ: "'!='", LSS: "'<'", LEQ: "'<='", GTR: "'>'", GEQ: "'>='",
	ASSIGN: "'='", LPAREN: "'('", RPAREN: "')'", LBRACK: "'['", RBRACK: "']'",
	COMMA: "','", SEMICOLON: "';'", PERIOD: "'.'",
	AND: "and", OR: "or", NOT: "not", IN: "in", IF: "if", THEN: "then",
	ELSE: "else", TRUE: "true", FALSE: "false", FORMULA: "formula",
}

// String returns the token as an error message shows it.
func (t Token) String() string {
	if t >= 0 && int(t) < len(tokenNames) && tokenNames[t] != "" {
		return tokenNames[t]
	}
	return "token"
}

// Keywords maps each keyword's spelling to its token.
var Keywords = map[string]Token{
	"and": AND, "or": OR, "not": NOT, "in": IN, "if": IF, "then": THEN,
	"else": ELSE, "true": TRUE, "false": FALSE, "formula": FORMULA,
}

// keyword returns the token of a keyword, or IDENT; it agrees with the
// Keywords map (a test checks that), and a switch on the string is
// cheaper than the map lookup.
func keyword(name string) Token {
	switch name {
	case "and":
		return AND
	case "or":
		return OR
	case "not":
		return NOT
	case "in":
		return IN
	case "if":
		return IF
	case "then":
		return THEN
	case "else":
		return ELSE
	case "true":
		return TRUE
	case "false":
		return FALSE
	case "formula":
		return FORMULA
	}
	return IDENT
}

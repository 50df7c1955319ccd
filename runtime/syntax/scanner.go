package syntax

import (
	"fmt"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Item is one token as scanned, for completion and highlighting: its kind,
// its source text and its span (End is the first character after it).
type Item struct {
	Tok      Token
	Lit      string
	Pos, End Pos
}

// Scan splits src into tokens. It never fails: a character that cannot
// start a token, an invalid UTF-8 byte or an unterminated string gives an
// ILLEGAL item. Comments and blanks are skipped; every line break gives a
// NEWLINE item (brackets and trailing operators are not considered, unlike
// the parser), and the last item is always EOF.
func Scan(src string) []Item {
	var s scanner
	s.init(src, nil)
	items := make([]Item, 0, len(src)/3+1)
	for {
		items = append(items, Item{})
		it := &items[len(items)-1]
		s.scan(it)
		if it.Tok == EOF {
			return items
		}
	}
}

const eof = -1

// A scanner reads tokens from a source text. Errors go to onErr (if set);
// scanning always continues.
type scanner struct {
	src       string
	ch        rune // current character, or eof
	chw       int  // bytes of ch in src (1 for an invalid byte)
	off       int  // byte offset of ch
	rdOff     int  // byte offset after ch
	line, col int  // position of ch
	onErr     func(pos Pos, msg string)
}

func (s *scanner) init(src string, onErr func(Pos, string)) {
	*s = scanner{src: src, line: 1, onErr: onErr}
	if strings.HasPrefix(src, "\uFEFF") {
		// A byte-order mark is invisible in an editor: skip it without
		// counting a column.
		s.rdOff = len("\uFEFF")
	}
	s.next()
}

func (s *scanner) pos() Pos { return Pos{Offset: s.off, Line: s.line, Col: s.col} }

func (s *scanner) error(pos Pos, msg string) {
	if s.onErr != nil {
		s.onErr(pos, msg)
	}
}

// step does what next does when the current character is neither a line
// break nor the end and the following one is ASCII, and reports whether
// it could. It is small enough to be inlined, so the loops over names,
// numbers and blanks write "if !s.step() { s.next() }".
func (s *scanner) step() bool {
	if s.rdOff >= len(s.src) || s.src[s.rdOff] >= utf8.RuneSelf {
		return false
	}
	s.off = s.rdOff
	s.col++
	s.ch, s.chw = rune(s.src[s.rdOff]), 1
	s.rdOff++
	return true
}

// next moves to the following character, keeping line and column.
func (s *scanner) next() {
	if s.ch == eof {
		return
	}
	if s.ch == '\n' {
		s.line++
		s.col = 0
	}
	s.off = s.rdOff
	s.col++
	if s.rdOff >= len(s.src) {
		s.ch, s.chw = eof, 0
		return
	}
	r, w := rune(s.src[s.rdOff]), 1
	if r >= utf8.RuneSelf {
		r, w = utf8.DecodeRuneInString(s.src[s.rdOff:])
		if r == utf8.RuneError && w == 1 {
			s.error(s.pos(), fmt.Sprintf("invalid UTF-8 byte 0x%02x; save the text as UTF-8", s.src[s.rdOff]))
		}
	}
	s.rdOff += w
	s.ch, s.chw = r, w
}

// peekByte returns the byte k bytes after the current character, or 0.
func (s *scanner) peekByte(k int) byte {
	if i := s.rdOff + k; i < len(s.src) {
		return s.src[i]
	}
	return 0
}

func isLetter(ch rune) bool {
	return 'a' <= ch && ch <= 'z' || 'A' <= ch && ch <= 'Z' || ch == '_' ||
		ch >= utf8.RuneSelf && unicode.IsLetter(ch)
}

func isDigit(ch rune) bool { return '0' <= ch && ch <= '9' }

// asciiIdent marks the ASCII characters that may go on a name, so that
// the loop over a name tests one table entry per character.
var asciiIdent = func() (t [utf8.RuneSelf]bool) {
	for c := range t {
		t[c] = isLetter(rune(c)) || isDigit(rune(c))
	}
	return t
}()

func isIdentChar(ch rune) bool {
	if uint32(ch) < utf8.RuneSelf {
		return asciiIdent[ch]
	}
	return isOtherIdentChar(ch)
}

func isOtherIdentChar(ch rune) bool {
	return ch >= utf8.RuneSelf && (unicode.IsLetter(ch) || unicode.IsDigit(ch))
}

// skipBlank skips spaces, tabs, carriage returns and comments, stopping at
// a line break.
func (s *scanner) skipBlank() {
	for {
		switch s.ch {
		case ' ', '\t', '\r':
			if !s.step() {
				s.next()
			}
		case '#':
			for s.ch != '\n' && s.ch != eof {
				if !s.step() {
					s.next()
				}
			}
		default:
			return
		}
	}
}

// scan reads the next token into it (filled in place: an Item is too big
// to return by value in the hot path).
func (s *scanner) scan(it *Item) {
	s.skipBlank()
	pos := s.pos()
	it.Tok = s.scanToken(pos)
	it.Lit = s.src[pos.Offset:s.off]
	it.Pos = pos
	it.End = s.pos()
}

func (s *scanner) scanToken(pos Pos) Token {
	ch := s.ch
	switch {
	case isLetter(ch) || ch == '°':
		return s.scanIdent()
	case isDigit(ch) || ch == '.' && isDigit(rune(s.peekByte(0))):
		s.scanNumber()
		return NUMBER
	}
	if uint32(ch) < utf8.RuneSelf {
		if tok := oneCharToken[ch]; tok != ILLEGAL {
			if !s.step() {
				s.next()
			}
			return tok
		}
	}
	invalid := ch == utf8.RuneError && s.chw == 1
	s.next()
	switch ch {
	case eof:
		return EOF
	case '\n':
		return NEWLINE
	case '"':
		return s.scanString(pos)
	case '+':
		return ADD
	case '-':
		return SUB
	case '*':
		return MUL
	case '/':
		return QUO
	case '^':
		return POW
	case '(':
		return LPAREN
	case ')':
		return RPAREN
	case '[':
		return LBRACK
	case ']':
		return RBRACK
	case ',':
		return COMMA
	case ';':
		return SEMICOLON
	case '.':
		return PERIOD
	case '=':
		return s.pick('=', EQL, ASSIGN)
	case '<':
		return s.pick('=', LEQ, LSS)
	case '>':
		return s.pick('=', GEQ, GTR)
	case '!':
		if s.ch == '=' {
			s.next()
			return NEQ
		}
	}
	if !invalid { // an invalid byte was reported by next
		s.error(pos, illegalMessage(ch))
	}
	return ILLEGAL
}

// oneCharToken holds the tokens that are one character whatever follows
// ('.' only once a number has been ruled out), found by one table lookup;
// the switch in scanToken keeps them too, for the rare slow path.
var oneCharToken = [utf8.RuneSelf]Token{
	'+': ADD, '-': SUB, '*': MUL, '/': QUO, '^': POW,
	'(': LPAREN, ')': RPAREN, '[': LBRACK, ']': RBRACK,
	',': COMMA, ';': SEMICOLON, '.': PERIOD,
}

// pick consumes the character want if it comes next and returns yes, or
// returns no.
func (s *scanner) pick(want rune, yes, no Token) Token {
	if s.ch == want {
		s.next()
		return yes
	}
	return no
}

// illegalMessage says what is wrong with a character that starts no token,
// with a hint for the characters other languages use.
func illegalMessage(ch rune) string {
	msg := fmt.Sprintf("illegal character %q (U+%04X)", ch, ch)
	switch ch {
	case '!':
		return msg + "; write 'not x' for negation and '!=' for inequality"
	case '&':
		return msg + "; write 'and' to combine conditions"
	case '|':
		return msg + "; write 'or' to combine conditions"
	case '\'':
		return msg + "; strings use double quotes: \"text\""
	case '{', '}':
		return msg + "; records are written (name = value, ...)"
	case '%':
		return msg + "; write a percentage as a fraction, e.g. 0.25"
	}
	return msg + "; remove it"
}

func (s *scanner) scanIdent() Token {
	start := s.off
	if !s.step() { // the first character is a letter or '°'
		s.next()
	}
	for isIdentChar(s.ch) {
		if !s.step() {
			s.next()
		}
	}
	// Keywords are 2 to 7 lower-case ASCII letters: test that before the
	// map lookup, which most names (units above all) then skip.
	if n := s.off - start; n < 2 || n > 7 || s.src[start] < 'a' || s.src[start] > 't' {
		return IDENT
	}
	return keyword(s.src[start:s.off])
}

// scanNumber reads 20, 1.5, .5, 5., 1e-3. An 'e' not followed by digits is
// left for the next token, so 1eV is the number 1 and the unit eV.
func (s *scanner) scanNumber() {
	for isDigit(s.ch) {
		if !s.step() {
			s.next()
		}
	}
	if s.ch == '.' {
		if !s.step() {
			s.next()
		}
		for isDigit(s.ch) {
			if !s.step() {
				s.next()
			}
		}
	}
	if s.ch != 'e' && s.ch != 'E' {
		return
	}
	b := s.peekByte(0)
	if b == '+' || b == '-' {
		b = s.peekByte(1)
		if !isDigit(rune(b)) {
			return
		}
		s.next()
	} else if !isDigit(rune(b)) {
		return
	}
	s.next()
	for isDigit(s.ch) {
		if !s.step() {
			s.next()
		}
	}
}

// scanString reads a string after its opening quote at pos. An
// unterminated string is ILLEGAL and runs to the end of the line.
func (s *scanner) scanString(pos Pos) Token {
	for {
		ch := s.ch
		if ch == '\n' || ch == eof {
			s.error(pos, "string not terminated; close it with \" on the same line")
			return ILLEGAL
		}
		epos := s.pos()
		s.next()
		switch ch {
		case '"':
			return STRING
		case '\\':
			s.scanEscape(epos)
		}
	}
}

// scanEscape checks one escape after its backslash at pos.
func (s *scanner) scanEscape(pos Pos) {
	switch s.ch {
	case '"', '\\', 'n', 't':
		s.next()
		return
	case 'u':
		s.next()
		if _, ok := s.scanHexEscape(); !ok {
			s.error(pos, "bad \\u escape in string; write a code point as \\u{3bc} (1 to 6 hex digits, at most 10FFFF)")
		}
		return
	case '\n', eof:
		return // reported as an unterminated string
	}
	s.error(pos, fmt.Sprintf("unknown escape \\%c in string; the escapes are \\\" \\\\ \\n \\t and \\u{HEX}", s.ch))
}

// scanHexEscape reads {HEX} after \u and returns the code point.
func (s *scanner) scanHexEscape() (rune, bool) {
	if s.ch != '{' {
		return 0, false
	}
	s.next()
	var r rune
	n := 0
	for ; n < 7; n++ {
		d := hexVal(s.ch)
		if d < 0 {
			break
		}
		r = r*16 + rune(d)
		s.next()
	}
	if s.ch != '}' {
		return 0, false
	}
	s.next()
	return r, n >= 1 && n <= 6 && utf8.ValidRune(r)
}

func hexVal(ch rune) int {
	switch {
	case '0' <= ch && ch <= '9':
		return int(ch - '0')
	case 'a' <= ch && ch <= 'f':
		return int(ch-'a') + 10
	case 'A' <= ch && ch <= 'F':
		return int(ch-'A') + 10
	}
	return -1
}

// unquote returns the value of a scanned STRING token (quotes included).
// The scanner has reported any bad escape; here one is kept as written.
func unquote(raw string) string {
	body := raw[1 : len(raw)-1]
	if !strings.ContainsRune(body, '\\') {
		return body
	}
	var b strings.Builder
	b.Grow(len(body))
	for i := 0; i < len(body); i++ {
		c := body[i]
		if c != '\\' || i+1 >= len(body) {
			b.WriteByte(c)
			continue
		}
		i++
		switch body[i] {
		case '"', '\\':
			b.WriteByte(body[i])
		case 'n':
			b.WriteByte('\n')
		case 't':
			b.WriteByte('\t')
		case 'u':
			r, n := hexEscape(body[i+1:])
			if n == 0 {
				b.WriteString(`\u`)
				continue
			}
			b.WriteRune(r)
			i += n
		default:
			b.WriteByte('\\')
			b.WriteByte(body[i])
		}
	}
	return b.String()
}

// hexEscape decodes "{HEX}" at the start of t, returning the code point and
// the bytes used, or 0, 0 if it is not a valid escape.
func hexEscape(t string) (rune, int) {
	end := strings.IndexByte(t, '}')
	if len(t) < 3 || t[0] != '{' || end < 2 || end > 7 {
		return 0, 0
	}
	var r rune
	for _, c := range t[1:end] {
		d := hexVal(c)
		if d < 0 {
			return 0, 0
		}
		r = r*16 + rune(d)
	}
	if !utf8.ValidRune(r) {
		return 0, 0
	}
	return r, end + 1
}

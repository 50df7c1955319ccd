package display

import (
	"strings"
	"testing"
)

// demoCard is the leaky integrate-and-fire model (Lapicque's model as
// written in Gerstner, Kistler, Naud and Paninski, Neuronal Dynamics, 2014,
// eq. 1.5) with invented parameter values.
func demoCard() *Card {
	return &Card{
		Title:       "Leaky integrate-and-fire",
		Description: "Membrane potential relaxes to rest; a spike resets it. Values are invented.",
		Equations:   []string{`\tau_m \frac{dV}{dt} = -(V - E_L) + R I(t)`, `V \ge V_{th} \to V \gets V_{reset}`},
		Params: []Param{
			{Name: "tau_m", Symbol: `\tau_m`, Value: 20, Unit: "ms", Note: "membrane time constant"},
			{Name: "E_L", Symbol: "E_L", Value: -70, Unit: "mV", Note: "resting potential"},
			{Name: "R", Symbol: "R", Value: 1e8, Unit: "Ω", Note: "input resistance"},
		},
		Source: "Gerstner et al. (2014), Neuronal Dynamics, ch. 1",
	}
}

func TestCardGolden(t *testing.T) {
	c := demoCard()
	txt, err := c.Text()
	if err != nil {
		t.Fatal(err)
	}
	h, _ := c.HTML()
	md, _ := c.Markdown()
	golden(t, "card.txt.golden", txt+"\n")
	golden(t, "card.html.golden", h+"\n")
	golden(t, "card.md.golden", md)
	if !strings.Contains(md, `$$ \tau_m \frac{dV}{dt} = -(V - E_L) + R I(t) $$`) {
		t.Error("markdown lacks the $$ … $$ equation")
	}
	if !strings.Contains(h, `\(\tau_m \frac{dV}{dt}`) || strings.Contains(h, "<script") {
		t.Error("HTML lacks the \\( … \\) LaTeX or contains a script")
	}
}

func TestLatexText(t *testing.T) {
	cases := []struct{ in, text, html string }{
		{`\tau_m`, "τ_m", "τ<sub>m</sub>"},
		{`V_{th}`, "V_th", "V<sub>th</sub>"},
		{`x^2`, "x^2", "x<sup>2</sup>"},
		{`\frac{dV}{dt}`, "dV/dt", "dV/dt"},
		{`\frac{V - E}{R}`, "(V − E)/R", "(V − E)/R"},
		{`\dot{V}`, "V\u0307", "V\u0307"},
		{`a < b`, "a < b", "a &lt; b"},
		{`\unknown`, `\unknown`, `\unknown`},
		{`g_{Na} m^3 h`, "g_Na m^3 h", "g<sub>Na</sub> m<sup>3</sup> h"},
		// The formulas and ranges of stdlib/activation's descriptor table.
		// The readings follow the ISO 80000-2:2019 names of the functions
		// (log, arctan, sgn, max; from memory) and the usual spoken form of a cases
		// environment, "value if condition" (common practice).
		{`\sigma(az) = \frac{1}{1+e^{-az}}`, "σ(az) = 1/(1 + e^(−az))", "σ(az) = 1/(1 + e<sup>−az</sup>)"},
		{`\arctan(az)`, "arctan(az)", "arctan(az)"},
		{`(-\pi/2, \pi/2)`, "(−π/2, π/2)", "(−π/2, π/2)"},
		{`H(z) = \begin{cases}0 & z<0\\ h_0 & z=0\\ 1 & z>0\end{cases}`,
			"H(z) = 0 if z < 0; h_0 if z = 0; 1 if z > 0",
			"H(z) = 0 if z &lt; 0; h<sub>0</sub> if z = 0; 1 if z &gt; 0"},
		{`\{0, h_0, 1\}`, "{0, h_0, 1}", "{0, h<sub>0</sub>, 1}"},
		{`\operatorname{sgn}(z) = \begin{cases}-1 & z<0\\ s_0 & z=0\\ 1 & z>0\end{cases}`,
			"sgn(z) = −1 if z < 0; s_0 if z = 0; 1 if z > 0",
			"sgn(z) = −1 if z &lt; 0; s<sub>0</sub> if z = 0; 1 if z &gt; 0"},
		{`\max(0, z)`, "max(0, z)", "max(0, z)"},
		{`\begin{cases}r z & z\ge 0\\ l z & z<0\end{cases}`, "r z if z ≥ 0; l z if z < 0", "r z if z ≥ 0; l z if z &lt; 0"},
		{`\frac{1}{a}\log(1+e^{az})`, "(1/a) log(1 + e^(az))", "(1/a) log(1 + e<sup>az</sup>)"},
		{`\begin{cases}z & z>0\\ \alpha(e^{z}-1) & z\le 0\end{cases}`,
			"z if z > 0; α(e^z − 1) if z ≤ 0", "z if z &gt; 0; α(e<sup>z</sup> − 1) if z ≤ 0"},
		{`(-\alpha, \infty)`, "(−α, ∞)", "(−α, ∞)"},
		// Spacing and signs: a minus after an operator or at the start of
		// a group or script is unary; operator names after an operand are
		// spaced; an \end without \begin is dropped.
		{`x^{-1} - 2\sin x`, "x^(−1) − 2 sin x", "x<sup>−1</sup> − 2 sin x"},
		{`V_{th}\end{cases}`, "V_th", "V<sub>th</sub>"},
		{`\frac{a}{b} = c`, "a/b = c", "a/b = c"},
	}
	for _, c := range cases {
		if got := latexText(c.in); got != c.text {
			t.Errorf("latexText(%q) = %q, want %q", c.in, got, c.text)
		}
		if got := latexHTML(c.in); got != c.html {
			t.Errorf("latexHTML(%q) = %q, want %q", c.in, got, c.html)
		}
	}
}

func TestCardErrors(t *testing.T) {
	cases := []struct {
		name string
		c    *Card
		want string
	}{
		{"nil", nil, "card is nil"},
		{"untitled", &Card{}, "has no title"},
		{"unnamed param", &Card{Title: "x", Params: []Param{{}}}, "parameter 1 has no name"},
	}
	for _, c := range cases {
		if _, err := c.c.Bundle(); err == nil || !strings.Contains(err.Error(), c.want) {
			t.Errorf("%s: error %v, want %q", c.name, err, c.want)
		}
	}
}

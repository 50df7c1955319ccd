package stdlib

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/loligo-lab/loligo/runtime"
)

func TestWriteReadBack(t *testing.T) {
	path := filepath.Join(t.TempDir(), "summary.csv")
	// the invented step file, filtered, written and read back
	src := `steps = read("../examples/data/l5-steps.csv")
strong = steps[steps.current >= 200 pA]
write(strong, "` + path + `")
back = read("` + path + `")
back.rate`
	v, err := eval(t, nil, &record{}, src)
	if err != nil {
		t.Fatal(err)
	}
	got, ok := v.(*runtime.Vector)
	if !ok {
		t.Fatalf("back.rate is %s", v.Type())
	}
	// rows of examples/data/l5-steps.csv with current ≥ 200 pA (the file itself)
	want := []float64{14.5, 22.9, 30.2, 36.8, 42.1, 46.9, 50.8}
	if len(got.V) != len(want) {
		t.Fatalf("read back %d rates, want %d", len(got.V), len(want))
	}
	for i, w := range want {
		// Hz is the SI unit of rate (SI Brochure 9th ed., table 4): values are
		// stored unscaled and CSV numbers are written in the shortest form
		// that reads back exactly, so the one rounding is the parse: 1e-15 rel.
		if !near(got.V[i], w, 0, 1e-15) {
			t.Errorf("rate[%d] = %v, want %v", i, got.V[i], w)
		}
	}
	data, _ := os.ReadFile(path)
	if !strings.HasPrefix(string(data), "# invented demo data") || !strings.Contains(string(data), "current (pA),rate (Hz)") {
		t.Errorf("written file lost its comment or unit headers:\n%s", data)
	}
	ents, _ := os.ReadDir(filepath.Dir(path))
	if len(ents) != 1 {
		t.Errorf("the folder holds %d entries after an atomic write, want 1", len(ents))
	}
}

func TestReadErrors(t *testing.T) {
	dir := t.TempDir()
	files := map[string]string{
		"badunit.csv": "# invented demo data\n# second comment\ncurrent (pAmp),rate (Hz)\n1,2\n",
		"badcell.csv": "current (pA),rate (Hz)\n1,2\n3,fast\n",
		"angle.csv":   "# invented demo data\nangle (deg),rate (Hz)\n0,5\n45,12\n",
	}
	for name, body := range files {
		if err := os.WriteFile(filepath.Join(dir, name), []byte(body), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	cases := []struct {
		src  string
		want []string
		not  []string // must not be suggested
	}{
		// the unknown unit is named with its column and the header's line (3, after two comments),
		// and the fix includes leaving a dimensionless column without a unit
		{`read("` + filepath.Join(dir, "badunit.csv") + `")`, []string{"line 3", `column "current"`, "pAmp", "no unit for a dimensionless column"}, nil},
		// an angle unit: angles are dimensionless (SI Brochure, 9th ed., 2019: rad = m/m = 1; table number 4 from memory),
		// so the header goes without a unit; never a near-miss unit of temperature or a current
		{`read("` + filepath.Join(dir, "angle.csv") + `")`, []string{`column "angle"`, "take no unit", `header as "angle"`}, []string{"degC", "(pA)"}},
		{`read("` + filepath.Join(dir, "badcell.csv") + `")`, []string{"badcell.csv", "line 3"}, nil},
		{`read(3 mV)`, []string{"argument path must be a string"}, nil},
		{`read("` + filepath.Join(dir, "none.csv") + `")`, []string{"no file", "check the name"}, nil},
	}
	for _, c := range cases {
		_, err := eval(t, nil, &record{}, c.src)
		if err == nil {
			t.Errorf("%s: no error", c.src)
			continue
		}
		for _, w := range c.want {
			if !strings.Contains(err.Error(), w) {
				t.Errorf("%s: error %q lacks %q", c.src, err, w)
			}
		}
		for _, w := range c.not {
			if strings.Contains(err.Error(), w) {
				t.Errorf("%s: error %q suggests %q", c.src, err, w)
			}
		}
	}
}

func TestTableFieldsAndShow(t *testing.T) {
	v, err := eval(t, nil, &record{}, `read("../examples/data/l5-steps.csv")`)
	if err != nil {
		t.Fatal(err)
	}
	tv := v.(*TableValue)
	if got := strings.Join(tv.FieldNames(), ","); got != "current,rate,rate_se,trials" {
		t.Errorf("field names %q, want the file's column names", got)
	}
	bs, err := tv.Show()
	if err != nil || len(bs) != 1 {
		t.Fatalf("Show: %d bundles, %v", len(bs), err)
	}
	html, _ := bs[0].Data["text/html"].(string)
	for _, w := range []string{"current (pA)", "rate (Hz)", "invented demo data"} {
		if !strings.Contains(html, w) {
			t.Errorf("table HTML lacks %q", w)
		}
	}
}

func TestProgressReachesOutput(t *testing.T) {
	reg := runtime.NewRegistry()
	reg.Register(&runtime.Builtin{
		Name: "work", Category: "test", Doc: "Reports progress over four steps.",
		Fn: func(c *runtime.Call) (runtime.Value, error) {
			p := progressFor(c, "work", 4)
			for range 4 {
				p.Add(1)
			}
			p.Done()
			return runtime.Num(4), nil
		},
	})
	nb := &record{}
	if _, err := eval(t, reg, nb, "work()"); err != nil {
		t.Fatal(err)
	}
	// Jupyter messaging spec, display_data / update_display_data: one display
	// with a display_id, later ones update that same id.
	if len(nb.shown) < 2 {
		t.Fatalf("notebook got %d progress outputs, want a display and at least one update", len(nb.shown))
	}
	for i, s := range nb.shown {
		if s.id == "" || s.id != nb.shown[0].id || s.update != (i > 0) {
			t.Errorf("output %d: id %q update %v; want id %q, update %v", i, s.id, s.update, nb.shown[0].id, i > 0)
		}
	}
	if last := nb.shown[len(nb.shown)-1].b.PlainText(); !strings.Contains(last, "done") {
		t.Errorf("final progress %q does not say done", last)
	}
	if len(nb.streams) != 0 || len(nb.lines) != 0 {
		t.Errorf("notebook got stray streams %q", nb.streams)
	}
	term := &terminal{}
	if _, err := eval(t, reg, term, "work()"); err != nil {
		t.Fatal(err)
	}
	if len(term.shown) != 0 || len(term.lines) < 2 || !strings.Contains(term.lines[len(term.lines)-1], "done") {
		t.Errorf("terminal got %d displays and lines %q; want no displays and lines ending in done", len(term.shown), term.lines)
	}
}

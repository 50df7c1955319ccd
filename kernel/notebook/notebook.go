// Package notebook reads, executes and writes notebooks in the open nbformat
// (version 4) and renders an executed notebook as one self-contained HTML
// report. It drives the same kernel.Session a front end would, so a notebook
// run with no front end gives the outputs it would give in one.
package notebook

import (
	"encoding/json"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/google/uuid"
)

// Notebook is an nbformat 4 document.
type Notebook struct {
	Cells         []*Cell        `json:"cells"`
	Metadata      map[string]any `json:"metadata"`
	NBFormat      int            `json:"nbformat"`
	NBFormatMinor int            `json:"nbformat_minor"`
}

// Cell is one cell: "code", "markdown" or "raw".
type Cell struct {
	ID             string         `json:"id,omitempty"`
	Type           string         `json:"cell_type"`
	Metadata       map[string]any `json:"metadata"`
	Source         Source         `json:"source"`
	Outputs        []*Output      `json:"outputs,omitempty"`
	ExecutionCount *int           `json:"execution_count,omitempty"`
	Attachments    map[string]any `json:"attachments,omitempty"`
}

// Output is one output of a code cell, as nbformat stores it.
type Output struct {
	Type           string         `json:"output_type"` // stream, display_data, execute_result, error
	Name           string         `json:"name,omitempty"`
	Text           Source         `json:"text,omitempty"`
	Data           map[string]any `json:"data,omitempty"`
	Metadata       map[string]any `json:"metadata,omitempty"`
	ExecutionCount *int           `json:"execution_count,omitempty"`
	EName          string         `json:"ename,omitempty"`
	EValue         string         `json:"evalue,omitempty"`
	Traceback      []string       `json:"traceback,omitempty"`

	displayID string // kept while executing, for update_display_data; never saved
}

// Source is multi-line text, stored by nbformat either as one string or as
// a list of lines; it is read in both forms and written as a list.
type Source string

// UnmarshalJSON accepts a string or a list of strings.
func (s *Source) UnmarshalJSON(b []byte) error {
	var one string
	if err := json.Unmarshal(b, &one); err == nil {
		*s = Source(one)
		return nil
	}
	var lines []string
	if err := json.Unmarshal(b, &lines); err != nil {
		return fmt.Errorf("text must be a string or a list of strings")
	}
	*s = Source(strings.Join(lines, ""))
	return nil
}

// MarshalJSON writes the lines as nbformat's own tools do, each line with
// its newline.
func (s Source) MarshalJSON() ([]byte, error) {
	lines := []string{}
	text := string(s)
	for text != "" {
		i := strings.IndexByte(text, '\n')
		if i < 0 {
			lines = append(lines, text)
			break
		}
		lines = append(lines, text[:i+1])
		text = text[i+1:]
	}
	return json.Marshal(lines)
}

// Read parses a notebook. It accepts nbformat 4 (any minor version) and says
// what is wrong with anything else.
func Read(r io.Reader) (*Notebook, error) {
	var nb Notebook
	dec := json.NewDecoder(r)
	if err := dec.Decode(&nb); err != nil {
		return nil, fmt.Errorf("notebook: not a notebook file (%v); expected nbformat 4 JSON", err)
	}
	if nb.NBFormat != 4 {
		return nil, fmt.Errorf("notebook: nbformat %d is not supported; save it as nbformat 4", nb.NBFormat)
	}
	for i, c := range nb.Cells {
		if c == nil {
			return nil, fmt.Errorf("notebook: cell %d is empty (null)", i+1)
		}
		switch c.Type {
		case "code", "markdown", "raw":
		default:
			return nil, fmt.Errorf("notebook: cell %d has unknown cell_type %q", i+1, c.Type)
		}
		if c.Metadata == nil {
			c.Metadata = map[string]any{}
		}
	}
	if nb.Metadata == nil {
		nb.Metadata = map[string]any{}
	}
	return &nb, nil
}

// ReadFile reads a notebook from a file.
func ReadFile(path string) (*Notebook, error) {
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("notebook: %v", err)
	}
	defer f.Close()
	return Read(f)
}

// New returns an empty notebook whose metadata names the kernel and language.
func New(kernelName, displayName, language, fileExt string) *Notebook {
	return &Notebook{
		NBFormat: 4, NBFormatMinor: 5,
		Metadata: map[string]any{
			"kernelspec":    map[string]any{"name": kernelName, "display_name": displayName, "language": language},
			"language_info": map[string]any{"name": language, "file_extension": fileExt},
		},
	}
}

// AddCell appends a cell with a fresh id.
func (nb *Notebook) AddCell(kind, source string) *Cell {
	c := &Cell{ID: newID(), Type: kind, Metadata: map[string]any{}, Source: Source(source)}
	nb.Cells = append(nb.Cells, c)
	return c
}

// newID makes a cell id as nbformat 4.5 asks: 1–64 characters of letters,
// digits, '-' and '_'.
func newID() string { return strings.ReplaceAll(uuid.NewString(), "-", "")[:16] }

// Write writes the notebook as indented JSON, the form nbformat's tools
// write, so that diffs of notebooks stay readable.
func (nb *Notebook) Write(w io.Writer) error {
	for _, c := range nb.Cells {
		if c.ID == "" && (nb.NBFormatMinor >= 5) {
			c.ID = newID()
		}
		if c.Type == "code" && c.Outputs == nil {
			c.Outputs = []*Output{}
		}
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", " ")
	enc.SetEscapeHTML(false)
	return enc.Encode(nb)
}

// MarshalJSON keeps "outputs" and "execution_count" on code cells (nbformat
// requires both, null when not run) and off other cells.
func (c *Cell) MarshalJSON() ([]byte, error) {
	type plain Cell
	if c.Type != "code" {
		return json.Marshal((*plain)(c))
	}
	outputs := c.Outputs
	if outputs == nil {
		outputs = []*Output{}
	}
	return json.Marshal(struct {
		*plain
		Outputs        []*Output `json:"outputs"`
		ExecutionCount *int      `json:"execution_count"`
	}{(*plain)(c), outputs, c.ExecutionCount})
}

// WriteFile writes the notebook atomically: to a temporary file in the same
// folder, renamed over path only when complete.
func (nb *Notebook) WriteFile(path string) error {
	return WriteAtomic(path, nb.Write)
}

// WriteAtomic writes a file through write, atomically.
func WriteAtomic(path string, write func(io.Writer) error) error {
	dir := filepath.Dir(path)
	tmp, err := os.CreateTemp(dir, "."+filepath.Base(path)+".*")
	if err != nil {
		return fmt.Errorf("notebook: cannot write %s: %v", path, err)
	}
	name := tmp.Name()
	defer os.Remove(name) // no-op after a successful rename
	if err := write(tmp); err != nil {
		tmp.Close()
		return fmt.Errorf("notebook: writing %s: %v", path, err)
	}
	if err := tmp.Chmod(0o644); err != nil {
		tmp.Close()
		return fmt.Errorf("notebook: %v", err)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("notebook: writing %s: %v", path, err)
	}
	if err := os.Rename(name, path); err != nil {
		return fmt.Errorf("notebook: cannot write %s: %v", path, err)
	}
	return nil
}

// MarshalJSON writes the fields nbformat's schema asks of each output type:
// display_data and execute_result always carry data and metadata (possibly
// empty); stream and error carry none of those.
func (o *Output) MarshalJSON() ([]byte, error) {
	type plain Output
	switch o.Type {
	case "display_data", "execute_result":
		return json.Marshal(struct {
			*plain
			Data     map[string]any `json:"data"`
			Metadata map[string]any `json:"metadata"`
		}{(*plain)(o), orEmpty(o.Data), orEmpty(o.Metadata)})
	}
	return json.Marshal((*plain)(o))
}

// Package display builds the MIME bundles that Loligo shows: tables,
// figures, model cards and progress, each rendered in the formats a
// notebook front end or a plain-text console can show. It is a leaf: it
// imports nothing of Loligo's, so any layer may fill its data types and ask
// for bundles.
//
// The data types have plain exported fields; every one has a Bundle method
// (the Bundler interface) and a plain-text form:
//
//	type        bundle entries                                 files
//	Table       text/plain, text/html, text/csv, application/json   WriteCSV
//	Figure      image/svg+xml, text/plain (+ size metadata)        Save, SaveSVG, SavePNG
//	Card        text/html, text/markdown, text/plain
//	Progress    text/plain, text/html (updated in place)
//
// A worked example: a membrane-potential trace over its stimulus, and a
// table of invented spike rates, shown as two outputs.
//
//	t, v, i := ...                     // []float64, time in ms, V in mV, I in nA
//	fig := &display.Figure{
//		Title:   "Invented demo cell",
//		SharedX: true,
//		Panels: []display.Panel{
//			{YLabel: "V (mV)", Series: []display.Series{
//				{Kind: display.Line, Name: "V", X: t, Y: v},
//				{Kind: display.HLine, Name: "threshold", Level: -50},
//			}},
//			{XLabel: "time (ms)", YLabel: "I (nA)", Height: 0.35,
//				Series: []display.Series{{Kind: display.Line, X: t, Y: i}}},
//		},
//	}
//	tab := &display.Table{Title: "Rates (invented)", Columns: []display.Column{
//		display.Numbers("I", "nA", []float64{0.1, 0.2, 0.3}),
//		display.Numbers("rate", "Hz", []float64{0, 12.5, 31.25}),
//	}}
//	outs, err := display.Bundles(tab, fig) // two bundles, two outputs
//
// The figure's text/plain entry then reads
//
//	Figure "Invented demo cell": 2 panels sharing one x axis
//	  panel 1: V (mV) vs time (ms), 1 line ("V": 100,001 points, min −75.2, max 41.9), …
//
// Lines of any length render to a bounded SVG: Decimate keeps, for every
// half-point column of the plot, the first, lowest, highest and last
// sample, so every extremum stays visible and a million-sample trace
// becomes a few thousand points. Non-finite values break a line and are
// counted in the description. The colours, line weights and typeface are
// chosen and justified in theme.go; output is deterministic, byte for byte.
//
// Errors say what is wrong and how to fix it, prefixed "display:"; bad data
// never panics. Files are written atomically: a temporary file in the same
// folder, then a rename.
package display

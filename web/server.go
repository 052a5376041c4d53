// Package web is gridloom's local web app: the planner page, its live
// fragment, the walkthrough that presents a plan step by step, the
// comparison of two plans on shared scales, the downloads (the figure as
// SVG with the plan inside, or PNG; plan files; the symbol table), the plan
// upload and the JSON API, all computed by grid and drawn by render.
//
// The pages keep no state on the server: the query string holds the whole
// plan (see planform.Form for the keys; planform.FigureForm for the
// figure's options), or both plans of a comparison under "a." and "b.", so
// a link reproduces a sketch, a step of a walkthrough or a comparison, and
// the back button walks through edits and steps. web holds HTTP and views
// only: each handler reads the query into planform's model, builds a view
// from it and its grid.Result, and renders a template.
//
// Security: every request is untrusted input. Bodies are limited to 1 MiB
// (a multipart upload to a 1 MiB file plus its envelope) and queries to
// 32 KiB; plan files are decoded by planfile, which bounds them; every
// response carries a Content Security Policy that allows only the app's own
// script and stylesheet. Names reach the page, the figure and the downloads
// only as escaped text. The app has no login: it is meant for the loopback
// interface, so it answers only its own host names (Config.AllowHosts; a
// rebound DNS name is refused), refuses POSTs that a browser marks as
// cross-site, and takes API bodies only as JSON or YAML. Heavy answers run
// a bounded number at a time (admission), and large exports are streamed,
// so memory stays bounded whatever the number of clients.
package web

import (
	"io"
	"log/slog"
	"time"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/render"
)

// Config is what the app serves.
type Config struct {
	// Plan is the plan that "/" opens with when its query is empty.
	Plan grid.Plan
	// Demos are offered on the page to open with one click.
	Demos []Demo
	// Figure draws the figure; nil means render.Figure.
	Figure FigureFunc
	// PNG draws the figure as a PNG image; nil means render.FigurePNG.
	PNG FigureFunc
	// SymbolCSV writes the symbol table; nil means render.SymbolCSV.
	SymbolCSV func(w io.Writer, r grid.Result) error
	// HeavySlots is how many heavy answers (PNG figures, symbol tables,
	// the API, comparisons, printed walkthroughs) are worked on at once;
	// 0 means runtime.GOMAXPROCS(0) − 1, at least 1. See admission.
	HeavySlots int
	// HeavyWait is how long a heavy request waits for a slot before a 503;
	// 0 means one second.
	HeavyWait time.Duration
	// PaceRate is the rate, in bytes per second, that the large figures
	// sent from the cache share (see pacer); 0 means 128 MiB/s and a
	// negative rate sends them unpaced.
	PaceRate int
	// Addr is the address the app listens on; its host name is one the
	// app answers to (see AllowHosts).
	Addr string
	// AllowHosts are more host names the app answers to, besides Addr's,
	// localhost (and names under .localhost) and IP addresses: the names
	// an operator serves it under, such as a machine's name on a LAN.
	// Any other Host header is refused, which defeats DNS rebinding.
	AllowHosts []string
}

// Demo is a plan the page offers to open. Name is its short key in the
// /demo/{name} link.
type Demo struct {
	Name string
	Plan grid.Plan
}

// FigureFunc draws a computed plan: render.Figure, render.FigurePNG, or a
// stand-in in tests.
type FigureFunc func(w io.Writer, r grid.Result, opt render.Options) error

// Body limits: a plan is at most planfile.MaxSize, and a multipart upload
// carries one such file plus its envelope.
const (
	maxBody       = planfile.MaxSize
	maxUploadBody = planfile.MaxSize + 64<<10
)

// The figure cache holds up to this many figures and bytes (a figure is
// 10 to 60 KiB at the default width, a few hundred at the widest).
const (
	maxCachedFigures = 64
	maxCachedBytes   = 16 << 20
)

// server is the app: what it serves and the little it keeps between
// requests (the figure cache and the static assets, compressed once).
type server struct {
	logger  *slog.Logger
	cfg     Config
	figures *responseCache
	assets  *assets
	heavy   *admission
}

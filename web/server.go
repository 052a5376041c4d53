// Package web is gridloom's local web app: the planner page, its live
// fragment, the walkthrough that presents a plan step by step, the
// comparison of two plans on shared scales, the downloads (the figure as
// SVG with the plan inside, or PNG; plan files; the symbol table), the plan
// upload and the JSON API, all computed by grid and drawn by render.
//
// The pages keep no state on the server: the query string holds the whole
// plan (see Form for the keys; FigureForm for the figure's options), or
// both plans of a comparison under "a." and "b.", so a link reproduces a
// sketch, a step of a walkthrough or a comparison, and the back button
// walks through edits and steps.
//
// Security: every request is untrusted input. Bodies are limited to 1 MiB
// (a multipart upload to a 1 MiB file plus its envelope) and queries to
// 32 KiB; plan files are decoded by planfile, which bounds them; every
// response carries a Content Security Policy that allows only the app's own
// script and stylesheet. Names reach the page, the figure and the downloads
// only as escaped text. The app has no login: it is meant for the loopback
// interface.
package web

import (
	"cmp"
	"compress/gzip"
	"crypto/sha256"
	"encoding/hex"
	"fmt"
	"io"
	"io/fs"
	"log/slog"
	"net/http"
	"path"
	"runtime/debug"
	"strconv"
	"strings"
	"sync"
	"time"

	"github.com/a-h/templ"
	"github.com/go-chi/chi/v5"
	"github.com/go-chi/chi/v5/middleware"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/render"
	"gridloom/static"
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
}

// Demo is a plan the page offers to open. Name is its short key in the
// /demo/{name} link.
type Demo struct {
	Name string
	Plan grid.Plan
}

// NewServer returns the app's handler: the router with its middleware and
// every route of routes.go.
func NewServer(logger *slog.Logger, cfg Config) http.Handler {
	if cfg.Figure == nil {
		cfg.Figure = render.Figure
	}
	if cfg.PNG == nil {
		cfg.PNG = render.FigurePNG
	}
	if cfg.SymbolCSV == nil {
		cfg.SymbolCSV = render.SymbolCSV
	}
	r := chi.NewRouter()
	addRoutes(r, logger, cfg)
	return r
}

// Body limits: a plan is at most planfile.MaxSize, and a multipart upload
// carries one such file plus its envelope.
const (
	maxBody       = planfile.MaxSize
	maxUploadBody = planfile.MaxSize + 64<<10
)

// The Content Security Policy of every response. Pages extend style-src
// with hashes of the inline figure's own styling (see styleSources).
const basePolicy = "default-src 'self'; img-src 'self' data:; object-src 'none'; base-uri 'none'; form-action 'self'; frame-ancestors 'none'"

func pagePolicy(styleSources []string) string {
	if len(styleSources) == 0 {
		return basePolicy
	}
	return basePolicy + "; style-src 'self' " + strings.Join(styleSources, " ")
}

// figurePolicy is the policy of a figure served on its own: an SVG document
// with no script and nothing to load.
func figurePolicy(styleSources []string) string {
	p := "default-src 'none'; img-src data:; frame-ancestors 'none'"
	if len(styleSources) > 0 {
		p += "; style-src " + strings.Join(styleSources, " ")
	}
	return p
}

// compressLevel is the gzip level of every compressed response: the
// fastest, since the app is served on the loopback interface, where a byte
// costs less than the time to save it (level 5 took two to three times as
// long for 12 to 22 % fewer bytes). It also keeps cheap the reset of the
// pooled compressor that the middleware does for every request.
const compressLevel = gzip.BestSpeed

// The figure cache holds up to this many figures and bytes (a figure is
// 10 to 60 KiB at the default width, a few hundred at the widest).
const (
	maxCachedFigures = 64
	maxCachedBytes   = 16 << 20
)

// compressible lists the content types worth compressing.
var compressible = []string{
	"text/html", "image/svg+xml", "application/json", "text/css", "text/javascript",
	"text/csv", "application/yaml", "text/plain",
}

func securityHeaders(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		h := w.Header()
		h.Set("Content-Security-Policy", basePolicy)
		h.Set("X-Content-Type-Options", "nosniff")
		h.Set("Referrer-Policy", "no-referrer")
		h.Set("X-Frame-Options", "DENY")
		h.Set("Cross-Origin-Opener-Policy", "same-origin")
		next.ServeHTTP(w, r)
	})
}

// limitBody stops reading a body at the limit; the handlers turn the read
// error into 413. A body whose declared length is over the limit is refused
// at once, except an upload, whose handler answers with the page and the
// reason beside the file control.
func limitBody(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		limit := int64(maxBody)
		upload := strings.HasPrefix(r.Header.Get("Content-Type"), "multipart/form-data")
		if upload {
			limit = maxUploadBody
		}
		if r.ContentLength > limit && !upload {
			tooLarge(w, r, limit)
			return
		}
		r.Body = http.MaxBytesReader(w, r.Body, limit)
		next.ServeHTTP(w, r)
	})
}

// MaxQuery is the longest query, in bytes, that the app reads; a longer
// one gets 414. A link holds the whole plan: the longest a plan within the
// engine's limits can write (16 partitions, every name 64 four-byte
// characters, every field given) is under 16 KiB, so 32 KiB leaves room for
// plans over the limits, which the page must still show to say what is
// wrong. The server in front must allow headers of more than MaxQuery bytes
// for the 414 and its message to be reached; the handler bounds its work
// without relying on it.
const MaxQuery = 32 << 10

// limitQuery refuses a query longer than MaxQuery with 414, before any
// handler parses it, saying how long it was and what the limit is.
func limitQuery(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		if n := len(r.URL.RawQuery); n > MaxQuery {
			msg := fmt.Sprintf("The link's query is %d bytes long; gridloom reads at most %d (32 KiB). A plan this large travels better as a plan file: open it under \"Open a plan file\".", n, MaxQuery)
			if isAPI(r) {
				writeJSON(w, http.StatusRequestURITooLong, apiError{Error: msg})
				return
			}
			http.Error(w, msg, http.StatusRequestURITooLong)
			return
		}
		next.ServeHTTP(w, r)
	})
}

func tooLarge(w http.ResponseWriter, r *http.Request, limit int64) {
	msg := "The request body is larger than " + sizeText(limit) + "; a plan file may be at most 1 MiB."
	if isAPI(r) {
		writeJSON(w, http.StatusRequestEntityTooLarge, apiError{Error: msg})
		return
	}
	http.Error(w, msg, http.StatusRequestEntityTooLarge)
}

func sizeText(n int64) string {
	if n == maxBody {
		return "1 MiB"
	}
	return "1 MiB plus 64 KiB for the upload form"
}

func isAPI(r *http.Request) bool { return strings.HasPrefix(r.URL.Path, "/api/") }

// statusClientClosed is logged for a request whose client went away before
// it was answered (nginx's 499); it is never sent.
const statusClientClosed = 499

// accessLog writes one structured line per request. The query is logged by
// size only: it holds a whole plan.
func accessLog(logger *slog.Logger) func(http.Handler) http.Handler {
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			ww := middleware.NewWrapResponseWriter(w, r.ProtoMajor)
			start := time.Now()
			next.ServeHTTP(ww, r)
			status := ww.Status()
			if status == 0 && r.Context().Err() != nil {
				status = statusClientClosed
			}
			logger.LogAttrs(r.Context(), slog.LevelInfo, "request",
				slog.String("id", middleware.GetReqID(r.Context())),
				slog.String("method", r.Method),
				slog.String("path", r.URL.Path),
				slog.Int("query_bytes", len(r.URL.RawQuery)),
				slog.Int("status", cmp.Or(status, http.StatusOK)),
				slog.Int("bytes", ww.BytesWritten()),
				slog.Duration("duration", time.Since(start)),
			)
		})
	}
}

// recoverPanics turns a panic in a handler into a logged 500, so that one
// bad request cannot take the app down.
func recoverPanics(logger *slog.Logger) func(http.Handler) http.Handler {
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			defer func() {
				v := recover()
				if v == nil {
					return
				}
				if v == http.ErrAbortHandler {
					panic(v)
				}
				logger.LogAttrs(r.Context(), slog.LevelError, "panic",
					slog.String("id", middleware.GetReqID(r.Context())),
					slog.Any("value", v), slog.String("stack", string(debug.Stack())))
				if isAPI(r) {
					writeJSON(w, http.StatusInternalServerError, apiError{Error: "Internal error; the log has the details."})
					return
				}
				http.Error(w, "Internal error; the log has the details.", http.StatusInternalServerError)
			}()
			next.ServeHTTP(w, r)
		})
	}
}

// staticHandler serves the embedded assets, at the root of its own path
// space, with an ETag, so that browsers revalidate them cheaply and never run
// a stale script after an upgrade. Only files are served, no listings.
func staticHandler() http.Handler {
	files := http.FileServerFS(static.FS)
	var (
		once  sync.Once
		etags map[string]string
	)
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		once.Do(func() { etags = hashAssets(static.FS) })
		name := strings.TrimPrefix(path.Clean(r.URL.Path), "/")
		tag, ok := etags[name]
		if !ok {
			handleNotFound()(w, r)
			return
		}
		w.Header().Set("ETag", tag)
		w.Header().Set("Cache-Control", "no-cache")
		files.ServeHTTP(w, r)
	})
}

// hashAssets returns an ETag for every regular file of fsys.
func hashAssets(fsys fs.FS) map[string]string {
	out := map[string]string{}
	_ = fs.WalkDir(fsys, ".", func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() || strings.HasSuffix(p, ".go") {
			return err
		}
		b, err := fs.ReadFile(fsys, p)
		if err != nil {
			return err
		}
		sum := sha256.Sum256(b)
		out[p] = `"` + hex.EncodeToString(sum[:8]) + `"`
		return nil
	})
	return out
}

// writeHTML renders c into memory and sends it with status, so that a
// template failure sends a clean 500 and never half a page. It compresses
// the page itself, when the client takes gzip, and sends it in one write
// with its length: the browser then reads the answer in one piece rather
// than as the compressor's chunks.
func writeHTML(w http.ResponseWriter, r *http.Request, logger *slog.Logger, status int, c templ.Component, styleSources []string) {
	buf := getBuffer()
	defer putBuffer(buf)
	if err := c.Render(r.Context(), buf); err != nil {
		if r.Context().Err() != nil {
			return // the client went away (templ stops on a done context): no one to answer, nothing broken
		}
		logger.LogAttrs(r.Context(), slog.LevelError, "template", slog.String("id", middleware.GetReqID(r.Context())), slog.Any("err", err))
		http.Error(w, "Internal error: the page could not be built; the log has the details.", http.StatusInternalServerError)
		return
	}
	h := w.Header()
	h.Set("Content-Security-Policy", pagePolicy(styleSources))
	h.Set("Content-Type", "text/html; charset=utf-8")
	h.Set("Cache-Control", "no-cache")
	body := buf.Bytes()
	if acceptsGzip(r) {
		gz := getBuffer()
		defer putBuffer(gz)
		if gzipBytes(gz, body) == nil {
			h.Set("Content-Encoding", "gzip")
			body = gz.Bytes()
		}
	}
	h.Add("Vary", "Accept-Encoding")
	h.Set("Content-Length", strconv.Itoa(len(body)))
	w.WriteHeader(status)
	_, _ = w.Write(body)
}

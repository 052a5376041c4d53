package web

import (
	"bufio"
	"bytes"
	"context"
	"fmt"
	"io"

	"encoding/json"
	"github.com/a-h/templ"
	"github.com/klauspost/compress/gzip"
	"mime"
	"net/http"
	"slices"
	"strconv"
	"strings"
)

// Every answer of the app leaves through send (or, for a kept answer,
// cachedResponse.send with the gzip form made by the same gzipBytes): one
// place decides whether to compress, by one reading of Accept-Encoding.

// compressLevel is the gzip level of every compressed response, by
// klauspost/compress, which compresses the campus fragment in less than
// half the standard library's time (BenchmarkCompressFragment): the
// fastest level, since the app is served on the loopback interface, where a byte
// costs less than the time to save it (level 5 took two to three times as
// long for 12 to 22 % fewer bytes). It also keeps cheap the reset of a
// kept compressor.
const compressLevel = gzip.BestSpeed

// compressible lists the content types worth compressing.
var compressible = []string{
	"text/html", "image/svg+xml", "application/json", "text/css", "text/javascript",
	"text/csv", "application/yaml", "text/plain",
}

func isCompressible(ctype string) bool {
	mt, _, _ := mime.ParseMediaType(ctype)
	return slices.Contains(compressible, mt)
}

// acceptsGzip reports whether the request's Accept-Encoding lists gzip
// without q=0.
func acceptsGzip(r *http.Request) bool {
	for part := range strings.SplitSeq(r.Header.Get("Accept-Encoding"), ",") {
		name, params, _ := strings.Cut(strings.TrimSpace(part), ";")
		if strings.EqualFold(strings.TrimSpace(name), "gzip") {
			q := strings.ReplaceAll(params, " ", "")
			return q != "q=0" && q != "q=0.0" && q != "q=0.00" && q != "q=0.000"
		}
	}
	return false
}

// send answers with body in one write with its length, gzip-compressed when
// the content type is worth it and the client takes gzip: the browser then
// reads the answer in one piece rather than as a compressor's chunks.
func send(w http.ResponseWriter, r *http.Request, status int, ctype string, body []byte) {
	h := w.Header()
	h.Set("Content-Type", ctype)
	if isCompressible(ctype) {
		h.Add("Vary", "Accept-Encoding")
		if acceptsGzip(r) {
			gz := getBuffer()
			defer putBuffer(gz)
			if gzipBytes(gz, body) == nil {
				h.Set("Content-Encoding", "gzip")
				body = gz.Bytes()
			}
		}
	}
	h.Set("Content-Length", strconv.Itoa(len(body)))
	w.WriteHeader(status)
	_, _ = w.Write(body)
}

// sendJSON encodes v into memory first, so an encoding failure is a clean
// 500 from the caller.
func sendJSON(w http.ResponseWriter, r *http.Request, status int, v any) error {
	b, err := json.MarshalIndent(v, "", "  ")
	if err != nil {
		return err
	}
	send(w, r, status, "application/json; charset=utf-8", append(b, '\n'))
	return nil
}

// writeHTML renders c into memory and sends it with status, so that a
// template failure is a clean 500 and never half a page.
func writeHTML(w http.ResponseWriter, r *http.Request, status int, c templ.Component, styleSources []string) error {
	buf := getBuffer()
	defer putBuffer(buf)
	if err := c.Render(r.Context(), buf); err != nil {
		return fmt.Errorf("template: %w", err)
	}
	h := w.Header()
	h.Set("Content-Security-Policy", pagePolicy(styleSources))
	h.Set("Cache-Control", "no-cache")
	send(w, r, status, "text/html; charset=utf-8", buf.Bytes())
	return nil
}

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

// attach marks the response as a file to save, named after the plan.
func attach(w http.ResponseWriter, planName, suffix string) {
	w.Header().Set("Content-Disposition", mime.FormatMediaType("attachment", map[string]string{"filename": fileName(planName) + suffix}))
}

// fileName makes a plan name safe as a file name on any system: lower-case
// ASCII letters and digits, runs of anything else as one hyphen, at most 60
// characters; "gridloom-plan" when nothing is left, and "-plan" after a
// name that Windows keeps for a device (con, nul, com1 …).
func fileName(name string) string {
	var b strings.Builder
	dash := false
	for _, c := range strings.ToLower(name) {
		if (c >= 'a' && c <= 'z') || (c >= '0' && c <= '9') {
			if dash && b.Len() > 0 {
				b.WriteByte('-')
			}
			dash = false
			b.WriteRune(c)
			if b.Len() >= 60 {
				break
			}
			continue
		}
		dash = true
	}
	if b.Len() == 0 {
		return "gridloom-plan"
	}
	if windowsDevice(b.String()) {
		b.WriteString("-plan")
	}
	return b.String()
}

// windowsDevice reports whether Windows reserves s, with any extension, as
// the name of a device.
func windowsDevice(s string) bool {
	switch s {
	case "con", "prn", "aux", "nul":
		return true
	}
	return len(s) == 4 && (strings.HasPrefix(s, "com") || strings.HasPrefix(s, "lpt")) && s[3] >= '0' && s[3] <= '9'
}

// spares keeps up to a fixed number of values for reuse by any goroutine,
// across garbage collections. A sync.Pool did not suit the compressors and
// page buffers: what one processor puts back another cannot take, and a
// second collection drops it, so in the fragment benchmark every other
// answer made a new gzip writer (600 KiB of tables, zeroed).
type spares[T any] struct {
	free  chan T
	fresh func() T
}

func newSpares[T any](n int, fresh func() T) *spares[T] {
	return &spares[T]{free: make(chan T, n), fresh: fresh}
}

// get returns a spare, or a fresh value when none is free.
func (s *spares[T]) get() T {
	select {
	case v := <-s.free:
		return v
	default:
		return s.fresh()
	}
}

// put keeps v for a later get, or drops it when enough are kept.
func (s *spares[T]) put(v T) {
	select {
	case s.free <- v:
	default:
	}
}

// gzipWriters are the compressors of every answer; two cover the requests
// a local app serves at once (a busier moment makes more, and drops them
// after).
var gzipWriters = newSpares(2, func() *gzip.Writer {
	zw, _ := gzip.NewWriterLevel(nil, compressLevel)
	return zw
})

// gzipBytes compresses b into dst with a spare compressor.
func gzipBytes(dst *bytes.Buffer, b []byte) error {
	zw := gzipWriters.get()
	defer gzipWriters.put(zw)
	zw.Reset(dst)
	if _, err := zw.Write(b); err != nil {
		return err
	}
	return zw.Close()
}

// buffers hold pages while they are rendered and compressed: a fragment
// grows one to 60-70 KiB and its gzip form to 16 KiB; four serve two
// requests at once.
var buffers = newSpares(4, func() *bytes.Buffer { return new(bytes.Buffer) })

func getBuffer() *bytes.Buffer {
	b := buffers.get()
	b.Reset()
	return b
}

// putBuffer keeps b unless it grew past 256 KiB (a page far above the
// usual), so that a rare large answer does not stay in memory for good.
func putBuffer(b *bytes.Buffer) {
	if b.Cap() <= 256<<10 {
		buffers.put(b)
	}
}

// streamAfter is how much of a streamed answer is gathered before any of
// it is sent: an answer that ends within it leaves through send, whole and
// with its length, so small exports are answered as before and a failure
// within it is still a clean error answer.
const streamAfter = 64 << 10

// stream answers with what write writes, for answers too large to hold
// (the symbol table and the lattice document of a large plan reach tens of
// megabytes). Past streamAfter it sends the status and headers and writes
// on through a 32 KiB buffer and, when the client takes it, a compressor,
// so memory stays bounded whatever the size; a write fails once the client
// has gone, which stops write. A HEAD request gets the headers and write
// is not called. An error returned before anything was sent is the
// caller's to answer; after that the connection is ended, since a body
// half sent cannot turn into an error answer.
func stream(w http.ResponseWriter, r *http.Request, status int, ctype string, write func(io.Writer) error) error {
	if r.Method == http.MethodHead {
		h := w.Header()
		h.Set("Content-Type", ctype)
		if isCompressible(ctype) {
			h.Add("Vary", "Accept-Encoding")
		}
		w.WriteHeader(status)
		return nil
	}
	sw := &streamWriter{w: w, r: r, status: status, ctype: ctype, first: getBuffer()}
	defer sw.release()
	err := write(sw)
	if err == nil {
		err = sw.finish()
	}
	if err == nil {
		return nil
	}
	if r.Context().Err() != nil {
		return nil // the client left: no one to answer; the access log says 499
	}
	if sw.out == nil {
		return err
	}
	panic(http.ErrAbortHandler)
}

// streamWriter gathers the first streamAfter bytes of an answer and then
// streams; see stream.
type streamWriter struct {
	w      http.ResponseWriter
	r      *http.Request
	status int
	ctype  string
	first  *bytes.Buffer // until streaming starts
	out    *bufio.Writer // once streaming
	zw     *gzip.Writer  // when compressing
}

func (s *streamWriter) Write(p []byte) (int, error) {
	if err := s.r.Context().Err(); err != nil {
		return 0, err
	}
	if s.out == nil {
		if s.first.Len()+len(p) <= streamAfter {
			return s.first.Write(p)
		}
		if err := s.start(); err != nil {
			return 0, err
		}
	}
	return s.out.Write(p)
}

// start sends the headers and what was gathered.
func (s *streamWriter) start() error {
	h := s.w.Header()
	h.Set("Content-Type", s.ctype)
	var to io.Writer = ctxWriter{s.r.Context(), s.w}
	if isCompressible(s.ctype) {
		h.Add("Vary", "Accept-Encoding")
		if acceptsGzip(s.r) {
			h.Set("Content-Encoding", "gzip")
			s.zw = gzipWriters.get()
			s.zw.Reset(to)
			to = s.zw
		}
	}
	s.w.WriteHeader(s.status)
	s.out = bufio.NewWriterSize(to, 32<<10)
	_, err := s.out.Write(s.first.Bytes())
	return err
}

// finish sends an answer that fitted in the first bytes, or the rest of a
// streamed one.
func (s *streamWriter) finish() error {
	if s.out == nil {
		send(s.w, s.r, s.status, s.ctype, s.first.Bytes())
		return nil
	}
	if err := s.out.Flush(); err != nil {
		return err
	}
	if s.zw != nil {
		return s.zw.Close()
	}
	return nil
}

func (s *streamWriter) release() {
	putBuffer(s.first)
	if s.zw != nil {
		s.zw.Reset(io.Discard)
		gzipWriters.put(s.zw)
	}
}

// ctxWriter fails every write once ctx is done, so that work written to a
// client that has gone stops at its next write.
type ctxWriter struct {
	ctx context.Context
	w   io.Writer
}

func (c ctxWriter) Write(p []byte) (int, error) {
	if err := c.ctx.Err(); err != nil {
		return 0, err
	}
	return c.w.Write(p)
}

package web

import (
	"bytes"
	"container/list"
	"crypto/sha256"
	"encoding/hex"
	"net/http"
	"strconv"
	"strings"
	"sync"
)

// responseCache keeps the latest answers of a handler whose answer is a
// function of the query alone, ready to send again: the figure of a query
// holds the whole plan and its options, so a figure asked for again (a
// link opened twice, the download after the page, a reloaded image) costs
// a lookup instead of a computation, a drawing and a compression. Only 200
// answers are kept, by path and raw query (the SVG and PNG figures share one cache), with their headers and, compressed once,
// their gzip form. It holds at most maxEntries answers and maxBytes of
// them; the least recently sent go first.
type responseCache struct {
	maxEntries, maxBytes int
	pace                 *pacer // shared by the large answers; nil sends at once

	mu      sync.Mutex
	size    int                      // bytes held, plain and gzip
	order   *list.List               // of *cachedResponse, most recent first
	entries map[string]*list.Element // by query
	flights map[string]*flight       // answers being made, by query
}

// flight is an answer being made for a query that others asked for too:
// they wait for it rather than each drawing the same figure (64 clients
// asking at once for the 4800 px PNG of the largest plan drew it over and
// over, one a slot, until the first was kept, and the rest got 503).
type flight struct {
	done    chan struct{}   // closed when the answer is made
	e       *cachedResponse // the answer, nil when it was not a 200
	waiters int             // requests that joined it, under the cache's mu
}

// join returns the flight of key and whether the caller leads it (makes
// the answer and lands the flight).
func (c *responseCache) join(key string) (*flight, bool) {
	c.mu.Lock()
	defer c.mu.Unlock()
	if f, ok := c.flights[key]; ok {
		f.waiters++
		return f, false
	}
	f := &flight{done: make(chan struct{})}
	c.flights[key] = f
	return f, true
}

// land ends the flight of key with its answer e (nil if none to share).
func (c *responseCache) land(key string, f *flight, e *cachedResponse) {
	c.mu.Lock()
	delete(c.flights, key)
	c.mu.Unlock()
	f.e = e
	close(f.done)
}

type cachedResponse struct {
	query  string
	header http.Header
	body   []byte
	gz     []byte
}

func (c *cachedResponse) size() int { return len(c.query) + len(c.body) + len(c.gz) }

func newResponseCache(maxEntries, maxBytes int) *responseCache {
	return &responseCache{maxEntries: maxEntries, maxBytes: maxBytes, order: list.New(), entries: map[string]*list.Element{}, flights: map[string]*flight{}}
}

func (c *responseCache) get(query string) (*cachedResponse, bool) {
	c.mu.Lock()
	defer c.mu.Unlock()
	e, ok := c.entries[query]
	if !ok {
		return nil, false
	}
	c.order.MoveToFront(e)
	return e.Value.(*cachedResponse), true
}

func (c *responseCache) put(r *cachedResponse) {
	if r.size() > c.maxBytes {
		return
	}
	c.mu.Lock()
	defer c.mu.Unlock()
	if e, ok := c.entries[r.query]; ok { // two requests raced; keep one
		c.order.MoveToFront(e)
		return
	}
	c.entries[r.query] = c.order.PushFront(r)
	c.size += r.size()
	for c.order.Len() > c.maxEntries || c.size > c.maxBytes {
		old := c.order.Remove(c.order.Back()).(*cachedResponse)
		delete(c.entries, old.query)
		c.size -= old.size()
	}
}

// cached answers from c when it can and otherwise lets next answer,
// keeping a 200 answer for the next request of the same query. next is
// asked for the plain answer; the cache compresses it once. Requests for
// a query whose answer is being made wait for it; when it is not a 200
// (a refusal, a 503, a client that left) each asks next for its own.
func cached(c *responseCache, next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		key := r.URL.Path + "?" + r.URL.RawQuery // two routes may share a cache
		if e, ok := c.get(key); ok {
			e.sendPaced(w, r, c.pace)
			return
		}
		if r.Method == http.MethodHead { // no body to keep: the handler skips it
			next.ServeHTTP(w, r)
			return
		}
		f, lead := c.join(key)
		if !lead {
			select {
			case <-f.done:
				if f.e != nil {
					f.e.sendPaced(w, r, c.pace)
					return
				}
			case <-r.Context().Done():
				return // gone while waiting: nothing to send, nothing made
			}
			f = nil // the flight made no 200: make this answer alone
		}
		e := func() (e *cachedResponse) {
			if f != nil { // land before sending, so the waiters need not wait for a paced write
				defer func() { c.land(key, f, e) }() // nil when no 200, or next panicked
			}
			return c.make(key, next, w, r)
		}()
		if e != nil {
			e.sendPaced(w, r, c.pace)
		}
	})
}

// make asks next for the plain answer to r and, when it is a 200, keeps
// it, with its ETag and gzip form, and returns it for the caller to send;
// any other answer it sends to w itself and returns nil.
func (c *responseCache) make(key string, next http.Handler, w http.ResponseWriter, r *http.Request) *cachedResponse {
	plain := r.Clone(r.Context())
	plain.Header.Del("Accept-Encoding")
	rec := &recorder{header: http.Header{}}
	next.ServeHTTP(rec, plain)
	if rec.status != http.StatusOK {
		rec.replay(w)
		return nil
	}
	rec.header.Del("Content-Length")
	rec.header.Del("Vary")
	rec.header.Set("Etag", etagOf(rec.body.Bytes()))
	rec.header.Set("Cache-Control", "no-cache")
	e := &cachedResponse{query: key, header: rec.header, body: rec.body.Bytes()}
	if isCompressible(rec.header.Get("Content-Type")) {
		var gz bytes.Buffer
		if gzipBytes(&gz, e.body) == nil {
			e.gz = gz.Bytes()
		}
	}
	c.put(e)
	return e
}

// send writes the kept answer, gzip-compressed when it has a gzip form and
// the client takes it, by the same reading of Accept-Encoding as send.
func (e *cachedResponse) send(w http.ResponseWriter, r *http.Request) {
	e.sendPaced(w, r, nil)
}

// sendPaced is send with the body written through p. A request that
// names the answer's ETag in If-None-Match (a browser that holds it) gets
// 304 and no body.
func (e *cachedResponse) sendPaced(w http.ResponseWriter, r *http.Request, p *pacer) {
	h := w.Header()
	if tag := e.header.Get("Etag"); tag != "" && matchesETag(r.Header.Get("If-None-Match"), tag) {
		h.Set("Etag", tag)
		h.Set("Cache-Control", e.header.Get("Cache-Control"))
		w.WriteHeader(http.StatusNotModified)
		return
	}
	for k, v := range e.header {
		h[k] = v
	}
	body := e.body
	if e.gz != nil {
		h.Add("Vary", "Accept-Encoding")
		if acceptsGzip(r) {
			h.Set("Content-Encoding", "gzip")
			body = e.gz
		}
	}
	h.Set("Content-Length", strconv.Itoa(len(body)))
	w.WriteHeader(http.StatusOK)
	if r.Method != http.MethodHead {
		_ = p.write(r.Context(), w, body)
	}
}

// etagOf is the ETag of a kept answer: the first 8 bytes of its SHA-256.
// The plain and the gzip form share it, as they are the same figure.
func etagOf(body []byte) string {
	sum := sha256.Sum256(body)
	return `"` + hex.EncodeToString(sum[:8]) + `"`
}

// matchesETag tells whether an If-None-Match header names tag, by the weak
// comparison RFC 9110 section 13.1.2 asks for ("*" matches any).
func matchesETag(header, tag string) bool {
	for t := range strings.SplitSeq(header, ",") {
		t = strings.TrimPrefix(strings.TrimSpace(t), "W/")
		if t == "*" || t == tag {
			return true
		}
	}
	return false
}

// recorder holds an answer in memory.
type recorder struct {
	header http.Header
	status int
	body   bytes.Buffer
}

func (rr *recorder) Header() http.Header { return rr.header }

func (rr *recorder) WriteHeader(status int) {
	if rr.status == 0 {
		rr.status = status
	}
}

func (rr *recorder) Write(p []byte) (int, error) {
	rr.WriteHeader(http.StatusOK)
	return rr.body.Write(p)
}

// replay sends a recorded answer that is not kept.
func (rr *recorder) replay(w http.ResponseWriter) {
	h := w.Header()
	for k, v := range rr.header {
		h[k] = v
	}
	w.WriteHeader(max(rr.status, http.StatusOK))
	_, _ = w.Write(rr.body.Bytes())
}

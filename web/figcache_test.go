package web

import (
	"bytes"
	"compress/gzip"
	"fmt"
	"io"
	"net/http"
	"net/http/httptest"
	"runtime"
	"sync"
	"sync/atomic"
	"testing"
	"time"
)

// A figure asked for again is the same answer, from the cache, in either
// encoding; a refusal is never kept; the cache stays within its bounds.
func TestFigureCache(t *testing.T) {
	calls := 0
	next := http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		calls++
		if r.URL.Query().Get("bad") != "" {
			http.Error(w, "no", http.StatusUnprocessableEntity)
			return
		}
		w.Header().Set("Content-Security-Policy", "default-src 'none'")
		w.Header().Set("Content-Type", "image/svg+xml")
		_, _ = io.WriteString(w, "<svg>"+r.URL.RawQuery+"</svg>")
	})
	c := newResponseCache(2, 1<<20)
	h := cached(c, next)
	get := func(query string, gz bool) *httptest.ResponseRecorder {
		t.Helper()
		req := httptest.NewRequest(http.MethodGet, "/figure.svg?"+query, nil)
		if gz {
			req.Header.Set("Accept-Encoding", "gzip, deflate")
		}
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		return w
	}
	plain := func(w *httptest.ResponseRecorder) string {
		t.Helper()
		if w.Header().Get("Content-Encoding") != "gzip" {
			return w.Body.String()
		}
		zr, err := gzip.NewReader(bytes.NewReader(w.Body.Bytes()))
		if err != nil {
			t.Fatal(err)
		}
		b, err := io.ReadAll(zr)
		if err != nil {
			t.Fatal(err)
		}
		return string(b)
	}
	for i, gz := range []bool{false, true, false, true} {
		w := get("a=1", gz)
		if got := plain(w); w.Code != 200 || got != "<svg>a=1</svg>" || w.Header().Get("Content-Security-Policy") != "default-src 'none'" || w.Header().Get("Content-Type") != "image/svg+xml" {
			t.Errorf("request %d (gzip %v): status %d, body %q, headers %v", i, gz, w.Code, got, w.Header())
		}
		if enc := w.Header().Get("Content-Encoding"); (enc == "gzip") != gz {
			t.Errorf("request %d (gzip %v): Content-Encoding %q", i, gz, enc)
		}
	}
	if calls != 1 {
		t.Errorf("the handler ran %d times for one query, want once", calls)
	}
	for range 2 {
		if w := get("bad=1", true); w.Code != http.StatusUnprocessableEntity {
			t.Errorf("refusal: status %d", w.Code)
		}
	}
	if calls != 3 {
		t.Errorf("the handler ran %d times, want 3: a refusal must not be kept", calls)
	}
	for i := range 10 {
		get(fmt.Sprintf("n=%d", i), true)
	}
	if n := c.order.Len(); n != 2 || len(c.entries) != 2 {
		t.Errorf("the cache holds %d answers (%d keys), want its bound of 2", n, len(c.entries))
	}
	before := calls
	get("n=9", false) // the latest is still there
	get("a=1", false) // long gone
	if calls != before+1 {
		t.Errorf("the handler ran %d more times, want 1", calls-before)
	}
	for _, ae := range []struct {
		header string
		want   bool
	}{{"gzip", true}, {"deflate, gzip;q=0.5", true}, {"gzip;q=0", false}, {"br", false}, {"", false}} {
		r := httptest.NewRequest(http.MethodGet, "/", nil)
		r.Header.Set("Accept-Encoding", ae.header)
		if got := acceptsGzip(r); got != ae.want {
			t.Errorf("acceptsGzip(%q) = %v, want %v", ae.header, got, ae.want)
		}
	}
}

// Requests for a figure being drawn wait for it instead of drawing it
// again, and get the same answer; when the first answer is not a 200,
// each of them is answered on its own.
func TestFigureCacheDrawsOnce(t *testing.T) {
	var draws atomic.Int32
	release := make(chan struct{})
	status := http.StatusOK
	next := http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		code := http.StatusOK // what the waiters get when they ask on their own
		if draws.Add(1) == 1 {
			code = status
			<-release
		}
		w.Header().Set("Content-Type", "image/png")
		w.WriteHeader(code)
		_, _ = io.WriteString(w, "png of "+r.URL.RawQuery)
	})
	for _, first := range []int{http.StatusOK, http.StatusServiceUnavailable} {
		draws.Store(0)
		release = make(chan struct{})
		status = first
		c := newResponseCache(4, 1<<20)
		h := cached(c, next)
		const n = 6
		codes := make(chan int, n)
		var wg sync.WaitGroup
		for range n {
			wg.Go(func() {
				w := httptest.NewRecorder()
				h.ServeHTTP(w, httptest.NewRequest(http.MethodGet, "/figure.png?a=1", nil))
				if w.Code == http.StatusOK && w.Body.String() != "png of a=1" {
					t.Errorf("a waiter got %q", w.Body.String())
				}
				codes <- w.Code
			})
		}
		for give := time.Now().Add(10 * time.Second); ; { // until one draws and the others wait for it
			c.mu.Lock()
			f := c.flights["/figure.png?a=1"]
			joined := f != nil && f.waiters == n-1
			c.mu.Unlock()
			if joined {
				break
			}
			if time.Now().After(give) {
				close(release)
				t.Fatalf("first answer %d: after 10 s, %d draws and not %d requests waiting for the one drawing", first, draws.Load(), n-1)
			}
			runtime.Gosched()
		}
		close(release)
		wg.Wait()
		close(codes)
		ok := 0
		for code := range codes {
			if code == http.StatusOK {
				ok++
			}
		}
		wantDraws, wantOK := int32(1), n
		if first != http.StatusOK {
			wantDraws, wantOK = n, n-1 // the first keeps its 503; each waiter draws its own
		}
		if draws.Load() != wantDraws || ok != wantOK {
			t.Errorf("first answer %d: %d draws and %d answers of 200 for %d requests, want %d and %d", first, draws.Load(), ok, n, wantDraws, wantOK)
		}
	}
}

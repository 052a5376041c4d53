package web

import (
	"bytes"
	stdgzip "compress/gzip"
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"os"
	"runtime"
	"slices"
	"sync"
	"sync/atomic"
	"testing"

	"gridloom/grid/planfile"
	"gridloom/web/planform"
)

// Benchmarks of the HTTP stack: the page, fragment and figure handlers
// through the router; the figure endpoint against the floor, a bare
// handler that sends the same bytes with the same headers over the same
// loopback HTTP; and the live heap over 100 000 requests.
//
//	go test ./web -run '^$' -bench 'Routes|Floor' -benchmem -count 10
//	go test ./web -run '^$' -bench HeapUnderLoad -benchtime 1x -v
//
// Speeds are reported, never asserted: compare medians of several runs
// (benchstat) and ratios measured on one machine.

// perfPlans are the plans the benchmarks serve, by name: the demo plans and
// the heaviest plan a user can ask for, as page queries.
func perfPlans(b testing.TB) (names []string, queries map[string]string) {
	b.Helper()
	queries = map[string]string{}
	for _, d := range testConfig(b).Demos {
		names = append(names, d.Name)
		queries[d.Name] = planform.FormOf(d.Plan).Query()
	}
	data, err := os.ReadFile("../testdata/stress/fr2-2-2000mhz.yaml")
	if err != nil {
		b.Fatal(err)
	}
	p, err := planfile.DecodeYAML(data)
	if err != nil {
		b.Fatal(err)
	}
	names = append(names, "stress")
	queries["stress"] = planform.FormOf(p).Query()
	return names, queries
}

func perfServer(b testing.TB) http.Handler {
	return NewServer(slog.New(slog.NewTextHandler(io.Discard, nil)), testConfig(b))
}

// BenchmarkRoutes serves the page, the live fragment and the figure of each
// plan through the whole router (middleware included) into a recorder, as
// a browser asks for them (gzip accepted). wire-bytes is the size of one
// response body as sent.
func BenchmarkRoutes(b *testing.B) {
	h := perfServer(b)
	names, queries := perfPlans(b)
	for _, route := range []string{"/", "/fragment", "/figure.svg"} {
		for _, name := range names {
			b.Run(fmt.Sprintf("%s/%s", routeName(route), name), func(b *testing.B) {
				req := httptest.NewRequest(http.MethodGet, route+"?"+queries[name], nil)
				req.Header.Set("Accept-Encoding", "gzip")
				var n int
				b.ReportAllocs()
				for b.Loop() {
					w := httptest.NewRecorder()
					h.ServeHTTP(w, req)
					if w.Code != http.StatusOK {
						b.Fatalf("%s: status %d", route, w.Code)
					}
					n = w.Body.Len()
				}
				b.ReportMetric(float64(n), "wire-bytes")
			})
		}
	}
}

// BenchmarkCompressFragment compresses the campus fragment as sent (about
// 66 KB) at level 1 with the compressor the app uses (klauspost/compress)
// and with the standard library's, each writer kept and reset as the app
// keeps them. The app took klauspost's for this: on the shared 2-core
// machine 0.33-0.35 ms against 0.70-0.82 ms (medians of six), and
// 15 029 against 15 158 bytes.
func BenchmarkCompressFragment(b *testing.B) {
	h := perfServer(b)
	_, queries := perfPlans(b)
	w := httptest.NewRecorder()
	h.ServeHTTP(w, httptest.NewRequest(http.MethodGet, "/fragment?"+queries["campus"], nil))
	if w.Code != http.StatusOK || w.Header().Get("Content-Encoding") != "" {
		b.Fatalf("fragment: status %d, encoding %q", w.Code, w.Header().Get("Content-Encoding"))
	}
	page := w.Body.Bytes()
	for _, c := range []struct {
		name string
		zw   interface {
			io.WriteCloser
			Reset(io.Writer)
		}
	}{
		{"app", gzipWriters.get()},
		{"stdlib", must2(stdgzip.NewWriterLevel(nil, stdgzip.BestSpeed))},
	} {
		b.Run(c.name, func(b *testing.B) {
			var dst bytes.Buffer
			b.SetBytes(int64(len(page)))
			for b.Loop() {
				dst.Reset()
				c.zw.Reset(&dst)
				_, _ = c.zw.Write(page)
				_ = c.zw.Close()
			}
			b.ReportMetric(float64(dst.Len()), "wire-bytes")
		})
	}
}

func must2[T any](v T, err error) T {
	if err != nil {
		panic(err)
	}
	return v
}

func routeName(route string) string {
	if route == "/" {
		return "page"
	}
	return route[1:]
}

// floorHandler sends a recorded response again: its status, every header
// and the body, byte for byte. It is the least any handler of those bytes
// can cost.
func floorHandler(status int, header http.Header, body []byte) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		h := w.Header()
		for k, v := range header {
			h[k] = v
		}
		w.WriteHeader(status)
		_, _ = w.Write(body)
	})
}

// recordFigure fetches a figure through the router as a browser would
// (gzip accepted) and returns the response to replay.
func recordFigure(b *testing.B, h http.Handler, query string) (http.Header, []byte) {
	b.Helper()
	req := httptest.NewRequest(http.MethodGet, "/figure.svg?"+query, nil)
	req.Header.Set("Accept-Encoding", "gzip")
	w := httptest.NewRecorder()
	h.ServeHTTP(w, req)
	if w.Code != http.StatusOK {
		b.Fatalf("figure: status %d", w.Code)
	}
	header := w.Header().Clone()
	header.Del("X-Request-Id") // per request; the floor sends none
	return header, w.Body.Bytes()
}

// loopbackClient keeps connections alive and leaves the body as sent, so
// that both servers are read the same way.
func loopbackClient() *http.Client {
	return &http.Client{Transport: &http.Transport{MaxIdleConnsPerHost: 64, DisableCompression: true}}
}

// getAll sends GET url with gzip accepted and reads the whole body.
func getAll(c *http.Client, url string, buf *bytes.Buffer) (int, error) {
	req, err := http.NewRequest(http.MethodGet, url, nil)
	if err != nil {
		return 0, err
	}
	req.Header.Set("Accept-Encoding", "gzip")
	res, err := c.Do(req)
	if err != nil {
		return 0, err
	}
	defer res.Body.Close()
	buf.Reset()
	_, err = buf.ReadFrom(res.Body)
	return res.StatusCode, err
}

// BenchmarkFigureFloor compares the figure endpoint with the floor over real
// loopback HTTP, with concurrent keep-alive clients: "figure" is the router
// answering the same query again and again, "floor" a bare handler sending
// the same bytes (same headers: CSP, content type, gzip), and "fresh" the
// router answering a query it has never seen (each request its own
// caption), which no cache can answer. The throughput ratio is floor ns/op
// ÷ figure ns/op. The figure's and the floor's answers are checked to be
// the same bytes before timing.
func BenchmarkFigureFloor(b *testing.B) {
	h := perfServer(b)
	names, queries := perfPlans(b)
	for _, name := range names {
		header, body := recordFigure(b, h, queries[name])
		servers := []struct {
			kind string
			h    http.Handler
		}{{"figure", h}, {"floor", floorHandler(http.StatusOK, header, body)}, {"fresh", h}}
		for _, s := range servers {
			b.Run(s.kind+"/"+name, func(b *testing.B) {
				srv := httptest.NewServer(s.h)
				defer srv.Close()
				client := loopbackClient()
				defer client.CloseIdleConnections()
				url := srv.URL + "/figure.svg?" + queries[name]
				var first bytes.Buffer
				if code, err := getAll(client, url, &first); err != nil || code != http.StatusOK || !bytes.Equal(first.Bytes(), body) {
					b.Fatalf("%s: status %d (%v), %d bytes; want the %d recorded bytes", s.kind, code, err, first.Len(), len(body))
				}
				var seq atomic.Int64
				b.SetBytes(int64(len(body)))
				b.SetParallelism(2)
				b.ResetTimer()
				b.RunParallel(func(pb *testing.PB) {
					var buf bytes.Buffer
					for pb.Next() {
						u := url
						if s.kind == "fresh" {
							u += fmt.Sprintf("&fig.caption=run+%d", seq.Add(1))
						}
						if code, err := getAll(client, u, &buf); err != nil || code != http.StatusOK {
							b.Errorf("%s: status %d (%v)", s.kind, code, err)
							return
						}
					}
				})
				b.ReportMetric(float64(len(body)), "wire-bytes")
			})
		}
	}
}

// BenchmarkHeapUnderLoad sends 100 000 requests through the router from
// four clients (pages, fragments, figures, downloads and refusals of every
// plan) and reads the live heap after a collection every 10 000. The app
// keeps nothing between requests, so the heap must not grow: heap-growth-KiB
// is the last reading less the first (after a warm-up round of each client), heap-max-KiB
// the highest. Run it once: -benchtime 1x; -v prints the readings.
func BenchmarkHeapUnderLoad(b *testing.B) {
	const (
		total    = 100_000
		interval = 10_000
		clients  = 4
	)
	h := perfServer(b)
	names, queries := perfPlans(b)
	var paths []string
	for _, name := range names {
		q := queries[name]
		paths = append(paths, "/?"+q, "/fragment?"+q, "/figure.svg?"+q, "/figure.svg?download=1&"+q,
			"/plan.yaml?"+q, "/fragment?op=add&"+q, "/figure.svg?"+q+"&p0.size=5o")
	}
	paths = append(paths, "/static/app.js", "/nowhere", "/demo/port")
	serve := func(path string) {
		req := httptest.NewRequest(http.MethodGet, path, nil)
		req.Header.Set("Accept-Encoding", "gzip")
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		if w.Code >= 500 {
			b.Errorf("%s: status %d", path, w.Code)
		}
	}
	for range b.N {
		// Warm-up: each client serves every path once, so that one-off
		// caches and the spares kept for as many requests at once (gzip
		// writers and page buffers, a fixed number) are counted before the
		// first reading.
		var warm sync.WaitGroup
		for range clients {
			warm.Go(func() {
				for _, p := range paths {
					serve(p)
				}
			})
		}
		warm.Wait()
		readings := []uint64{liveHeap()}
		var next atomic.Int64
		for done := 0; done < total; done += interval {
			var wg sync.WaitGroup
			for range clients {
				wg.Go(func() {
					for n := next.Add(1); n <= int64(done+interval); n = next.Add(1) {
						serve(paths[int(n)%len(paths)])
					}
				})
			}
			wg.Wait()
			next.Store(int64(done + interval))
			readings = append(readings, liveHeap())
		}
		for i, r := range readings {
			b.Logf("after %6d requests: live heap %7.1f KiB", i*interval, float64(r)/1024)
		}
		first, last := readings[0], readings[len(readings)-1]
		b.ReportMetric(float64(first)/1024, "heap-start-KiB")
		b.ReportMetric(float64(slices.Max(readings))/1024, "heap-max-KiB")
		b.ReportMetric((float64(last)-float64(first))/1024, "heap-growth-KiB")
		b.ReportMetric(float64(total), "requests")
	}
}

// liveHeap is the heap in use after two collections (the second frees what
// sync.Pools kept through the first).
func liveHeap() uint64 {
	runtime.GC()
	runtime.GC()
	var m runtime.MemStats
	runtime.ReadMemStats(&m)
	return m.HeapAlloc
}

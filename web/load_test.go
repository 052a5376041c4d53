package web

import (
	"bytes"
	"context"
	"fmt"
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"runtime"
	"strings"
	"sync"
	"sync/atomic"
	"testing"
	"time"

	"gridloom/grid/planfile"
	"gridloom/web/planform"
)

// loadRequest is one request of the load mix and the status it must get.
type loadRequest struct {
	method, path, ctype string
	body                []byte
	chunked             bool // send the body without a declared length
	abandon             bool // leave before the answer, as a closed tab does
	want                int
}

func (lr loadRequest) String() string { return lr.method + " " + shorten(lr.path, 80) }

func shorten(s string, n int) string {
	if len(s) <= n {
		return s
	}
	return s[:n] + "…"
}

// loadMix is every kind of request the app answers, good and bad: pages,
// fragments, figures, downloads, edits, uploads, the API with good and bad
// bodies, the hostile corpus, hostile queries, 404 and 405.
func loadMix(t *testing.T, cfg Config) []loadRequest {
	t.Helper()
	var mix []loadRequest
	getReq := func(path string, want int) {
		mix = append(mix, loadRequest{method: http.MethodGet, path: path, want: want})
	}
	postReq := func(path, ctype string, body []byte, want int) {
		mix = append(mix, loadRequest{method: http.MethodPost, path: path, ctype: ctype, body: body, want: want})
	}
	for _, d := range cfg.Demos {
		q := planform.FormOf(d.Plan).Query()
		for _, path := range []string{"/?", "/fragment?", "/figure.svg?", "/plan.json?", "/plan.yaml?", "/symbols.csv?", "/fragment?op=add&"} {
			getReq(path+q, http.StatusOK)
		}
		getReq("/figure.svg?download=1&"+q, http.StatusOK)
		getReq("/?op=dup.0&"+q, http.StatusSeeOther)
		mix = append(mix, loadRequest{method: http.MethodHead, path: "/?" + q, want: http.StatusOK})
		body, err := planfile.EncodeJSON(d.Plan)
		if err != nil {
			t.Fatal(err)
		}
		postReq("/api/v1/render", "application/json", body, http.StatusOK)
		postReq("/api/v1/figure", "application/json", body, http.StatusOK)
		up, ctype := multipartBody(t, "plan", d.Name+".json", body)
		postReq("/open", ctype, up, http.StatusSeeOther)
	}
	q := campusQuery(t)
	evil := planform.FormOf(hostilePlan(t)).Query()
	bad := strings.Replace(q, "p1.size=50", "p1.size=5o", 1)
	for _, c := range []struct {
		path string
		want int
	}{
		{"/", http.StatusSeeOther},
		{"/demo/port", http.StatusSeeOther},
		{"/demo/nowhere", http.StatusNotFound},
		{"/?" + evil, http.StatusOK},
		{"/fragment?" + evil, http.StatusOK},
		{"/figure.svg?" + evil, http.StatusOK},
		{"/symbols.csv?" + evil, http.StatusOK},
		{"/?" + bad, http.StatusUnprocessableEntity},
		{"/figure.svg?" + bad, http.StatusUnprocessableEntity},
		{"/plan.json?" + bad, http.StatusUnprocessableEntity},
		{"/?" + q + "&op=del.99", http.StatusUnprocessableEntity},
		{"/?" + q + "&fc=NaN&span=99&p0.size=1e999", http.StatusUnprocessableEntity},
		{"/?" + q + "&p64.name=x", http.StatusUnprocessableEntity},
		{"/?" + strings.Replace(q, "name=Hillcrest", "name=100%zz", 1), http.StatusUnprocessableEntity},
		{"/?" + q + "&pad=" + strings.Repeat("x", MaxQuery), http.StatusRequestURITooLong},
		{"/fragment?" + strings.Repeat("p0.name=x&", 4000), http.StatusRequestURITooLong},
		{"/nowhere", http.StatusNotFound},
		{"/api/v2/render", http.StatusNotFound},
		{"/static/app.js", http.StatusOK},
		{"/static/../go.mod", http.StatusNotFound},
		{"/api/v1/render", http.StatusMethodNotAllowed},
	} {
		getReq(c.path, c.want)
	}
	mix = append(mix,
		loadRequest{method: http.MethodPost, path: "/", want: http.StatusMethodNotAllowed},
		loadRequest{method: http.MethodDelete, path: "/figure.svg", want: http.StatusMethodNotAllowed},
		loadRequest{method: http.MethodPost, path: "/api/v1/render", ctype: "application/json", chunked: true,
			body: append([]byte(`{"name": "`), bytes.Repeat([]byte("x"), maxBody+1024)...), want: http.StatusRequestEntityTooLarge},
	)
	postReq("/api/v1/render", "application/json", []byte(`{"carrier": `), http.StatusBadRequest)
	postReq("/api/v1/figure", "application/json", []byte(`[]`), http.StatusBadRequest)
	postReq("/api/v1/figure", "application/json", []byte(`{"partitions": []}`), http.StatusUnprocessableEntity)
	postReq("/open", "text/plain", []byte("name: x"), http.StatusBadRequest)
	for _, path := range []string{"/?" + q, "/fragment?" + q, "/figure.svg?" + evil} {
		mix = append(mix, loadRequest{method: http.MethodGet, path: path, abandon: true})
	}
	for _, c := range hostileCases(t) {
		data, err := os.ReadFile(filepath.Join("../testdata/hostile", c.file))
		if err != nil {
			t.Fatal(err)
		}
		postReq("/api/v1/render", planType(c.file), data, c.apiStatus)
	}
	return mix
}

// TestLoad drives the whole router, figure included, with 64 clients at
// once through the mix of loadMix, each request expecting its own status
// (some clients leave before their answer). It holds when no answer is a
// 5xx or otherwise unexpected, nothing is logged as an error, and the heap
// after the run (all connections closed, after a GC) is within
// maxHeapGrowth of the heap before it (after a warm-up round of every
// request, so one-off caches are already counted). The app keeps no state
// between requests, so anything it retains is a leak: 8 MiB is under
// 3 KiB per request of the run, while one page or figure kept per request
// would be hundreds of megabytes.
func TestLoad(t *testing.T) {
	if testing.Short() {
		t.Skip("the load test takes a few seconds; it runs without -short")
	}
	const (
		clients       = 64
		requests      = 3000
		maxHeapGrowth = 8 << 20
	)
	cfg := testConfig(t)
	// The heavy routes queue rather than refuse here, so that every
	// request gets the answer its kind should (the 503 of a full queue
	// has its own test, TestHeavyWorkIsAdmitted).
	cfg.HeavyWait = time.Minute
	logs := &logBuffer{}
	srv := httptest.NewServer(NewServer(slog.New(slog.NewTextHandler(logs, nil)), cfg))
	defer srv.Close()
	mix := loadMix(t, cfg)
	transport := &http.Transport{MaxIdleConns: clients, MaxIdleConnsPerHost: clients, DisableCompression: true}
	client := &http.Client{Transport: transport, Timeout: 60 * time.Second,
		CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse }}
	send := func(lr loadRequest) (int, error) {
		var body io.Reader
		if lr.body != nil {
			body = bytes.NewReader(lr.body)
			if lr.chunked {
				body = io.MultiReader(body) // hides the length
			}
		}
		ctx := context.Background()
		if lr.abandon {
			var cancel context.CancelFunc
			ctx, cancel = context.WithTimeout(ctx, time.Millisecond)
			defer cancel()
		}
		req, err := http.NewRequestWithContext(ctx, lr.method, srv.URL+lr.path, body)
		if err != nil {
			return 0, err
		}
		if lr.ctype != "" {
			req.Header.Set("Content-Type", lr.ctype)
		}
		res, err := client.Do(req)
		if err != nil {
			return 0, err
		}
		defer res.Body.Close()
		if _, err := io.Copy(io.Discard, res.Body); err != nil {
			return 0, err
		}
		return res.StatusCode, nil
	}

	// Warm-up: every request once, each checked.
	for _, lr := range mix {
		if got, err := send(lr); !lr.abandon && (err != nil || got != lr.want) {
			t.Fatalf("%s: status %d (%v), want %d", lr, got, err, lr.want)
		}
	}
	transport.CloseIdleConnections()
	goroutines := runtime.NumGoroutine()
	before := heapAfterGC()

	var (
		next, fiveXX, wrong, abandoned atomic.Int64
		mu                             sync.Mutex
		failures                       []string
		peak                           atomic.Uint64
		statuses                       sync.Map // status → *atomic.Int64
	)
	stopSampling := make(chan struct{})
	sampled := make(chan struct{})
	go func() { // the peak heap in use, sampled
		defer close(sampled)
		tick := time.NewTicker(50 * time.Millisecond)
		defer tick.Stop()
		for {
			select {
			case <-stopSampling:
				return
			case <-tick.C:
				var m runtime.MemStats
				runtime.ReadMemStats(&m)
				if m.HeapInuse > peak.Load() {
					peak.Store(m.HeapInuse)
				}
			}
		}
	}()
	start := time.Now()
	var wg sync.WaitGroup
	for range clients {
		wg.Go(func() {
			for n := next.Add(1); n <= requests; n = next.Add(1) {
				lr := mix[int(n)%len(mix)]
				got, err := send(lr)
				c, _ := statuses.LoadOrStore(got, new(atomic.Int64))
				c.(*atomic.Int64).Add(1)
				if got >= 500 {
					fiveXX.Add(1)
				}
				if lr.abandon {
					abandoned.Add(1)
					continue
				}
				if err != nil || got != lr.want {
					wrong.Add(1)
					mu.Lock()
					if len(failures) < 10 {
						failures = append(failures, fmt.Sprintf("%s: status %d (%v), want %d", lr, got, err, lr.want))
					}
					mu.Unlock()
				}
			}
		})
	}
	wg.Wait()
	elapsed := time.Since(start)
	close(stopSampling)
	<-sampled
	transport.CloseIdleConnections()
	srv.CloseClientConnections()
	// Connections end asynchronously; give their goroutines a moment.
	for deadline := time.Now().Add(5 * time.Second); runtime.NumGoroutine() > goroutines+4 && time.Now().Before(deadline); {
		time.Sleep(20 * time.Millisecond)
	}
	after := heapAfterGC()

	var counts []string
	statuses.Range(func(k, v any) bool {
		counts = append(counts, fmt.Sprintf("%d×%d", k, v.(*atomic.Int64).Load()))
		return true
	})
	t.Logf("%d requests (%d kinds, %d left unanswered, %d logged as 499) from %d clients in %v (%.0f/s); statuses %v; 5xx %d; heap %.1f MiB before, %.1f MiB after, peak in use %.1f MiB; goroutines %d before, %d after",
		requests, len(mix), abandoned.Load(), strings.Count(logs.String(), "status=499"), clients, elapsed.Round(time.Millisecond), float64(requests)/elapsed.Seconds(), counts, fiveXX.Load(),
		mib(before), mib(after), mib(peak.Load()), goroutines, runtime.NumGoroutine())
	if fiveXX.Load() > 0 || wrong.Load() > 0 {
		t.Errorf("%d answers were 5xx and %d not what the request should get; the first:\n%s", fiveXX.Load(), wrong.Load(), strings.Join(failures, "\n"))
	}
	if n := strings.Count(logs.String(), "level=ERROR"); n > 0 {
		i := strings.Index(logs.String(), "level=ERROR")
		t.Errorf("%d errors logged; the first: %.300s", n, logs.String()[i:])
	}
	if after > before && after-before > maxHeapGrowth {
		t.Errorf("the heap grew by %.1f MiB over the run (%.1f → %.1f MiB), more than %.0f MiB", mib(after-before), mib(before), mib(after), mib(maxHeapGrowth))
	}
	if n := runtime.NumGoroutine(); n > goroutines+4 {
		t.Errorf("%d goroutines after the run, %d before: a request leaves goroutines behind", n, goroutines)
	}
}

// heapAfterGC is the live heap after two collections, the second one
// clearing what sync.Pools kept through the first.
func heapAfterGC() uint64 {
	runtime.GC()
	runtime.GC()
	var m runtime.MemStats
	runtime.ReadMemStats(&m)
	return m.HeapAlloc
}

func mib(n uint64) float64 { return float64(n) / (1 << 20) }

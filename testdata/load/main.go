// Command load runs the real gridloom server and holds each heavy route
// under 64 concurrent clients for 20 s, while a few light clients time the
// page, its fragment and an asset; it prints, per route, the statuses, the
// light routes' p50/p99 and the server's peak resident memory (VmHWM of
// /proc/PID/status, Linux only). Each route gets a fresh server process, so
// each peak is that route's own. Loopback only.
//
// The light clients run in a process of their own, as a user's browser
// would (-light-in-process puts them beside the heavy ones, where their
// timings also wait behind 64 busy goroutines of one Go runtime). Their
// times inside the server, read from its access log, are printed too, and
// the processor time of the server and of this program: on a small machine
// the clients' own reading is a large share of the load.
//
// It lives under testdata so that `go test ./...` never runs it (issue 13;
// the numbers are in DEVELOPERS.md):
//
//	go build -o /tmp/gridloom ./cmd/gridloom
//	go run ./testdata/load -bin /tmp/gridloom [-route png] [-revalidate] [-light-in-process]
package main

import (
	"bufio"
	"bytes"
	"context"
	"flag"
	"fmt"
	"io"
	"net"
	"net/http"
	"os"
	"os/exec"
	"runtime"
	"slices"
	"strconv"
	"strings"
	"sync"
	"syscall"
	"time"

	"gridloom/grid/planfile"
	"gridloom/web/planform"
)

func main() {
	bin := flag.String("bin", "/tmp/gridloom", "the gridloom `binary` to run")
	clients := flag.Int("clients", 64, "concurrent clients on the heavy route")
	dur := flag.Duration("dur", 20*time.Second, "how long each route is held")
	planPath := flag.String("plan", "testdata/stress/fr2-2-16-partitions.yaml", "the heavy plan")
	only := flag.String("route", "", "run only the route whose name contains this")
	flag.BoolVar(&revalidate, "revalidate", false, "heavy clients send If-None-Match with the ETag of their last answer, as a browser reloading an image it holds does (a hostile client need not)")
	flag.BoolVar(&lightInProcess, "light-in-process", false, "run the light clients in this process, beside the heavy ones, instead of a process of their own")
	lightOf := flag.String("light-of", "", "run only the light clients against this `base URL` and print their times (the child process)")
	pageQ := flag.String("page-query", "", "the light page's query, for -light-of")
	flag.Parse()
	if *lightOf != "" {
		lightChild(*lightOf, *pageQ, *dur)
		return
	}
	if err := run(*bin, *clients, *dur, *planPath, *only); err != nil {
		fmt.Fprintln(os.Stderr, "load:", err)
		os.Exit(1)
	}
}

// The -light-in-process and -revalidate flags.
var lightInProcess, revalidate bool

type route struct {
	name, method, path, ctype string
	body                      []byte
}

func run(bin string, clients int, dur time.Duration, planPath, only string) error {
	data, err := os.ReadFile(planPath)
	if err != nil {
		return err
	}
	plan, err := planfile.Decode(data)
	if err != nil {
		return err
	}
	q := planform.FormOf(plan).Query()
	js, err := planfile.EncodeJSON(plan)
	if err != nil {
		return err
	}
	prefixed := func(p string) string {
		var parts []string
		for kv := range strings.SplitSeq(q, "&") {
			parts = append(parts, p+kv)
		}
		return strings.Join(parts, "&")
	}
	routes := []route{
		{name: "symbols.csv", method: "GET", path: "/symbols.csv?" + q},
		{name: "api render", method: "POST", path: "/api/v1/render", ctype: "application/json", body: js},
		{name: "figure.png 4800", method: "GET", path: "/figure.png?" + q + "&fig.width=4800"},
		{name: "compare", method: "GET", path: "/compare?" + prefixed("a.") + "&" + prefixed("b.")},
		{name: "walk print", method: "GET", path: "/walk?" + q + "&view=print"},
	}
	fmt.Printf("plan %s: query %d bytes; %d clients, %s a route\n\n", planPath, len(q), clients, dur)
	fmt.Printf("%-16s %8s %6s %8s %6s %6s %9s %9s %9s %8s\n", "route", "200", "304", "503", "5xx", "other", "light n", "p50 ms", "p99 ms", "VmHWM MB")
	for _, rt := range routes {
		if only != "" && !strings.Contains(rt.name, only) {
			continue
		}
		if err := runRoute(bin, rt, clients, dur); err != nil {
			return fmt.Errorf("%s: %w", rt.name, err)
		}
	}
	return nil
}

func runRoute(bin string, rt route, clients int, dur time.Duration) error {
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		return err
	}
	addr := ln.Addr().String()
	ln.Close()
	cmd := exec.Command(bin, "serve", "-addr", addr)
	stderr, _ := cmd.StderrPipe()
	if err := cmd.Start(); err != nil {
		return err
	}
	defer func() { _ = cmd.Process.Kill(); _ = cmd.Wait() }()
	logStatuses := map[string]int{}
	var srvLat []time.Duration // the light requests' time inside the server, from its log
	var logMu sync.Mutex
	go func() {
		sc := bufio.NewScanner(stderr)
		sc.Buffer(make([]byte, 1<<20), 1<<20)
		for sc.Scan() {
			line := sc.Text()
			if _, s, ok := strings.Cut(line, " status="); ok {
				logMu.Lock()
				logStatuses[strings.Fields(s)[0]]++
				if d, ok := lightDuration(line); ok {
					srvLat = append(srvLat, d)
				}
				logMu.Unlock()
			}
		}
	}()
	base := "http://" + addr
	for i := 0; ; i++ {
		if res, err := http.Get(base + "/static/app.css"); err == nil {
			res.Body.Close()
			break
		}
		if i > 100 {
			return fmt.Errorf("the server at %s did not answer", addr)
		}
		time.Sleep(50 * time.Millisecond)
	}
	pageQ := ""
	if res, err := (&http.Client{CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse }}).Get(base + "/demo/campus"); err == nil {
		_, pageQ, _ = strings.Cut(res.Header.Get("Location"), "?")
		res.Body.Close()
	}

	load1 := loadAverage()
	srv0, self0 := cpuOf(cmd.Process.Pid), selfCPU()
	ctx, cancel := context.WithTimeout(context.Background(), dur)
	defer cancel()
	tr := &http.Transport{MaxIdleConnsPerHost: clients + 8, DisableCompression: false}
	client := &http.Client{Transport: tr, Timeout: 60 * time.Second}
	var mu sync.Mutex
	statuses := map[int]int{}
	var wg sync.WaitGroup
	for range clients {
		wg.Add(1)
		go func() {
			defer wg.Done()
			etag := ""
			for ctx.Err() == nil {
				req, _ := http.NewRequestWithContext(ctx, rt.method, base+rt.path, bytes.NewReader(rt.body))
				if rt.ctype != "" {
					req.Header.Set("Content-Type", rt.ctype)
				}
				if revalidate && etag != "" {
					req.Header.Set("If-None-Match", etag)
				}
				res, err := client.Do(req)
				if err != nil {
					continue // the run's end cancels requests in flight
				}
				if t := res.Header.Get("Etag"); t != "" && res.StatusCode == http.StatusOK {
					etag = t
				}
				_, err = io.Copy(io.Discard, res.Body)
				res.Body.Close()
				if err != nil && ctx.Err() != nil {
					continue
				}
				mu.Lock()
				statuses[res.StatusCode]++
				mu.Unlock()
				if res.StatusCode == http.StatusServiceUnavailable {
					select { // as Retry-After asks, in part: a client that backs off a little
					case <-ctx.Done():
					case <-time.After(100 * time.Millisecond):
					}
				}
			}
		}()
	}
	// The light clients run in a process of their own, as a user's
	// browser would, unless asked to share this one: then their timings
	// also wait behind the heavy clients' goroutines in one Go runtime.
	type lightResult struct {
		lat  []time.Duration
		fail int
		err  error
	}
	lightDone := make(chan lightResult, 1)
	go func() {
		if lightInProcess {
			lat, fail := lightClients(ctx, base, pageQ)
			lightDone <- lightResult{lat, fail, nil}
			return
		}
		lat, fail, err := lightProcess(ctx, base, pageQ, dur)
		lightDone <- lightResult{lat, fail, err}
	}()
	peak := 0
	tick := time.NewTicker(200 * time.Millisecond)
	for ctx.Err() == nil {
		<-tick.C
		peak = max(peak, vmHWM(cmd.Process.Pid))
	}
	tick.Stop()
	wg.Wait()
	lr := <-lightDone
	if lr.err != nil {
		return lr.err
	}
	lat, lightFail := lr.lat, lr.fail
	srvCPU, selfCPU := cpuOf(cmd.Process.Pid)-srv0, selfCPU()-self0
	time.Sleep(200 * time.Millisecond)
	peak = max(peak, vmHWM(cmd.Process.Pid))
	pct := func(lat []time.Duration, p float64) float64 {
		if len(lat) == 0 {
			return 0
		}
		lat = slices.Sorted(slices.Values(lat))
		return float64(lat[min(len(lat)-1, int(p*float64(len(lat))))].Microseconds()) / 1000
	}
	other, fivexx := 0, 0
	for s, n := range statuses {
		switch {
		case s == 200 || s == 304 || s == 503:
		case s >= 500:
			fivexx += n
		default:
			other += n
		}
	}
	fmt.Printf("%-16s %8d %6d %8d %6d %6d %9d %9.1f %9.1f %8.1f\n", rt.name, statuses[200], statuses[304], statuses[503], fivexx, other+lightFail, len(lat), pct(lat, 0.5), pct(lat, 0.99), float64(peak)/1024)
	fmt.Printf("%16s load average %s at the start; processor time over the %s: server %.1f s, this program %.1f s (of %s on %d cores)\n",
		"", load1, dur, srvCPU.Seconds(), selfCPU.Seconds(), dur, runtime.NumCPU())
	logMu.Lock()
	fmt.Printf("%16s light requests inside the server (its log): n %d, p50 %.1f ms, p99 %.1f ms\n", "", len(srvLat), pct(srvLat, 0.5), pct(srvLat, 0.99))
	fmt.Printf("%16s server log statuses: %v\n", "", logStatuses)
	logMu.Unlock()
	return nil
}

// lightClients runs two light clients until ctx ends, one request after
// another with a pause of 20 ms: the page, the fragment and the stylesheet
// of the campus plan. It returns the times of the 200 answers and the
// count of other answers.
func lightClients(ctx context.Context, base, pageQ string) (lat []time.Duration, fail int) {
	var mu sync.Mutex
	var wg sync.WaitGroup
	light := []string{lightPaths[0] + "?" + pageQ, lightPaths[1] + "?" + pageQ, lightPaths[2]}
	for c := range 2 {
		wg.Add(1)
		go func() {
			defer wg.Done()
			lc := &http.Client{Transport: &http.Transport{}, Timeout: 10 * time.Second}
			for i := c; ctx.Err() == nil; i++ {
				start := time.Now()
				res, err := lc.Get(base + light[i%len(light)])
				if err != nil {
					continue
				}
				_, _ = io.Copy(io.Discard, res.Body)
				res.Body.Close()
				d := time.Since(start)
				mu.Lock()
				if res.StatusCode != http.StatusOK {
					fail++
				} else {
					lat = append(lat, d)
				}
				mu.Unlock()
				time.Sleep(20 * time.Millisecond)
			}
		}()
	}
	wg.Wait()
	return lat, fail
}

// lightProcess runs lightClients in a child process (this program with
// -light-of) for dur and reads its results: one line per answer, "ok" or
// "fail" and the time in nanoseconds.
func lightProcess(ctx context.Context, base, pageQ string, dur time.Duration) (lat []time.Duration, fail int, err error) {
	self, err := os.Executable()
	if err != nil {
		return nil, 0, err
	}
	out, err := exec.CommandContext(context.WithoutCancel(ctx), self, "-light-of", base, "-page-query", pageQ, "-dur", dur.String()).Output()
	if err != nil {
		return nil, 0, fmt.Errorf("the light clients' process: %w", err)
	}
	for line := range strings.SplitSeq(strings.TrimSpace(string(out)), "\n") {
		kind, ns, _ := strings.Cut(line, " ")
		n, _ := strconv.ParseInt(ns, 10, 64)
		if kind == "ok" {
			lat = append(lat, time.Duration(n))
		} else {
			fail++
		}
	}
	return lat, fail, nil
}

// lightChild is the child of lightProcess.
func lightChild(base, pageQ string, dur time.Duration) {
	ctx, cancel := context.WithTimeout(context.Background(), dur)
	defer cancel()
	lat, fail := lightClients(ctx, base, pageQ)
	w := bufio.NewWriter(os.Stdout)
	for _, d := range lat {
		fmt.Fprintf(w, "ok %d\n", d)
	}
	for range fail {
		fmt.Fprintln(w, "fail 0")
	}
	_ = w.Flush()
}

// lightPaths are the paths the light clients ask for.
var lightPaths = []string{"/", "/fragment", "/static/app.css"}

// lightDuration reads the duration of a light request from a line of the
// server's access log.
func lightDuration(line string) (time.Duration, bool) {
	_, p, _ := strings.Cut(line, " path=")
	_, d, _ := strings.Cut(line, " duration=")
	if p == "" || d == "" || !slices.Contains(lightPaths, strings.Fields(p)[0]) {
		return 0, false
	}
	dur, err := time.ParseDuration(strings.Fields(d)[0])
	return dur, err == nil
}

// loadAverage is the first three fields of /proc/loadavg.
func loadAverage() string {
	b, err := os.ReadFile("/proc/loadavg")
	if err != nil {
		return "unknown"
	}
	return strings.Join(strings.Fields(string(b))[:3], " ")
}

// cpuOf is the processor time (user and system) process pid has used, from
// fields 14 and 15 of /proc/PID/stat in clock ticks of 1/100 s (the
// USER_HZ of Linux on every common architecture); 0 if unknown.
func cpuOf(pid int) time.Duration {
	b, err := os.ReadFile("/proc/" + strconv.Itoa(pid) + "/stat")
	if err != nil {
		return 0
	}
	_, rest, ok := strings.Cut(string(b), ") ") // the name may hold spaces
	f := strings.Fields(rest)
	if !ok || len(f) < 13 {
		return 0
	}
	u, _ := strconv.Atoi(f[11])
	s, _ := strconv.Atoi(f[12])
	return time.Duration(u+s) * 10 * time.Millisecond
}

// selfCPU is the processor time this program has used: the clients'
// share of the machine, which the light timings also pay for.
func selfCPU() time.Duration {
	var ru syscall.Rusage
	if syscall.Getrusage(syscall.RUSAGE_SELF, &ru) != nil {
		return 0
	}
	return time.Duration(ru.Utime.Nano() + ru.Stime.Nano())
}

// vmHWM is the peak resident set of process pid in KiB, 0 if unknown.
func vmHWM(pid int) int {
	b, err := os.ReadFile("/proc/" + strconv.Itoa(pid) + "/status")
	if err != nil {
		return 0
	}
	for line := range strings.SplitSeq(string(b), "\n") {
		if v, ok := strings.CutPrefix(line, "VmHWM:"); ok {
			n, _ := strconv.Atoi(strings.TrimSuffix(strings.TrimSpace(v), " kB"))
			return n
		}
	}
	return 0
}

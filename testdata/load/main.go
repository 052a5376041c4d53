// Command load runs the real gridloom server and holds each heavy route
// under 64 concurrent clients for 20 s, while a few light clients time the
// page, its fragment and an asset; it prints, per route, the statuses, the
// light routes' p50/p99 and the server's peak resident memory (VmHWM of
// /proc/PID/status, Linux only). Each route gets a fresh server process, so
// each peak is that route's own. Loopback only. It lives under testdata so
// that `go test ./...` never runs it (issue 13; the numbers are in
// DEVELOPERS.md):
//
//	go build -o /tmp/gridloom ./cmd/gridloom
//	go run ./testdata/load -bin /tmp/gridloom
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
	"slices"
	"strconv"
	"strings"
	"sync"
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
	flag.Parse()
	if err := run(*bin, *clients, *dur, *planPath, *only); err != nil {
		fmt.Fprintln(os.Stderr, "load:", err)
		os.Exit(1)
	}
}

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
	fmt.Printf("%-16s %8s %8s %6s %6s %9s %9s %9s %8s\n", "route", "200", "503", "5xx", "other", "light n", "p50 ms", "p99 ms", "VmHWM MB")
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
	var logMu sync.Mutex
	go func() {
		sc := bufio.NewScanner(stderr)
		sc.Buffer(make([]byte, 1<<20), 1<<20)
		for sc.Scan() {
			if _, s, ok := strings.Cut(sc.Text(), " status="); ok {
				logMu.Lock()
				logStatuses[strings.Fields(s)[0]]++
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
			for ctx.Err() == nil {
				req, _ := http.NewRequestWithContext(ctx, rt.method, base+rt.path, bytes.NewReader(rt.body))
				if rt.ctype != "" {
					req.Header.Set("Content-Type", rt.ctype)
				}
				res, err := client.Do(req)
				if err != nil {
					continue // the run's end cancels requests in flight
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
	// Two light clients, one request after another: the page, the
	// fragment and the stylesheet of the campus plan.
	var lat []time.Duration
	lightFail := 0
	light := []string{"/?" + pageQ, "/fragment?" + pageQ, "/static/app.css"}
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
					lightFail++
				} else {
					lat = append(lat, d)
				}
				mu.Unlock()
				time.Sleep(20 * time.Millisecond)
			}
		}()
	}
	peak := 0
	tick := time.NewTicker(200 * time.Millisecond)
	for ctx.Err() == nil {
		<-tick.C
		peak = max(peak, vmHWM(cmd.Process.Pid))
	}
	tick.Stop()
	wg.Wait()
	time.Sleep(200 * time.Millisecond)
	peak = max(peak, vmHWM(cmd.Process.Pid))
	slices.Sort(lat)
	pct := func(p float64) float64 {
		if len(lat) == 0 {
			return 0
		}
		return float64(lat[min(len(lat)-1, int(p*float64(len(lat))))].Microseconds()) / 1000
	}
	other, fivexx := 0, 0
	for s, n := range statuses {
		switch {
		case s == 200 || s == 503:
		case s >= 500:
			fivexx += n
		default:
			other += n
		}
	}
	fmt.Printf("%-16s %8d %8d %6d %6d %9d %9.1f %9.1f %8.1f\n", rt.name, statuses[200], statuses[503], fivexx, other+lightFail, len(lat), pct(0.5), pct(0.99), float64(peak)/1024)
	logMu.Lock()
	fmt.Printf("%16s server log statuses: %v\n", "", logStatuses)
	logMu.Unlock()
	return nil
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

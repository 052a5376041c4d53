package main

import (
	"bytes"
	"context"
	"io"
	"net"
	"net/http"
	"regexp"
	"strings"
	"sync"
	"testing"
	"time"
)

// syncBuffer is a bytes.Buffer that the server goroutine and the test can
// share.
type syncBuffer struct {
	mu sync.Mutex
	b  bytes.Buffer
}

func (s *syncBuffer) Write(p []byte) (int, error) {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.Write(p)
}

func (s *syncBuffer) String() string {
	s.mu.Lock()
	defer s.mu.Unlock()
	return s.b.String()
}

var servingLine = regexp.MustCompile(`gridloom: serving (http://\S+)\n`)

// startServe runs the real program with args in the background and returns
// the address it serves, the stderr buffer, a cancel func and the channel
// that gets its error.
func startServe(t *testing.T, args ...string) (string, *syncBuffer, context.CancelFunc, <-chan error) {
	t.Helper()
	ctx, cancel := context.WithCancel(context.Background())
	t.Cleanup(cancel)
	stdout, stderr := &syncBuffer{}, &syncBuffer{}
	done := make(chan error, 1)
	go func() { done <- run(ctx, args, strings.NewReader(""), stdout, stderr) }()
	deadline := time.Now().Add(10 * time.Second)
	for time.Now().Before(deadline) {
		if m := servingLine.FindStringSubmatch(stdout.String()); m != nil {
			return m[1], stderr, cancel, done
		}
		select {
		case err := <-done:
			t.Fatalf("gridloom %s returned before serving: %v; stderr:\n%s", strings.Join(args, " "), err, stderr)
		case <-time.After(20 * time.Millisecond):
		}
	}
	t.Fatalf("gridloom %s printed no serving line; stdout %q, stderr %q", strings.Join(args, " "), stdout, stderr)
	return "", nil, nil, nil
}

func waitExit(t *testing.T, done <-chan error) error {
	t.Helper()
	select {
	case err := <-done:
		return err
	case <-time.After(15 * time.Second):
		t.Fatal("the server did not stop within 15 s of its context ending")
		return nil
	}
}

func TestServeAndShutDown(t *testing.T) {
	for _, args := range [][]string{
		{"serve", "-addr", "127.0.0.1:0"},
		{"-addr", "127.0.0.1:0"}, // serve is the default command
	} {
		t.Run(strings.Join(args, " "), func(t *testing.T) {
			base, stderr, cancel, done := startServe(t, args...)
			if !strings.HasPrefix(base, "http://127.0.0.1:") {
				t.Errorf("serving %s, want a loopback address", base)
			}
			res, err := http.Get(base + "/")
			if err != nil {
				t.Fatal(err)
			}
			body, _ := io.ReadAll(res.Body)
			res.Body.Close()
			if res.StatusCode != http.StatusOK || !strings.Contains(string(body), "Hillcrest campus 40 MHz") {
				t.Errorf("GET / (following the redirect to the demo plan): status %d, body %.200s", res.StatusCode, body)
			}
			cancel()
			if err := waitExit(t, done); err != nil {
				t.Errorf("after cancel: %v, want a clean exit", err)
			}
			if _, err := http.Get(base + "/"); err == nil {
				t.Error("the server still answers after shutting down")
			}
			if !strings.Contains(stderr.String(), "msg=request") {
				t.Errorf("no access log on stderr:\n%s", stderr)
			}
			if strings.Contains(stderr.String(), "no login") {
				t.Errorf("a loopback server warned about logins:\n%s", stderr)
			}
		})
	}
}

func TestServeBusyPort(t *testing.T) {
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	defer ln.Close()
	stdout, stderr, code := runCLI(t, "", "serve", "-addr", ln.Addr().String())
	if code != 1 {
		t.Errorf("exit %d, want 1", code)
	}
	if lines := strings.Split(strings.TrimSpace(stderr), "\n"); len(lines) != 1 || !strings.Contains(stderr, "already in use") || !strings.Contains(stderr, ln.Addr().String()) {
		t.Errorf("stderr %q, want one line naming the address in use", stderr)
	}
	if stdout != "" {
		t.Errorf("stdout %q, want nothing", stdout)
	}
}

func TestServePlanFlag(t *testing.T) {
	base, _, cancel, done := startServe(t, "serve", "-addr", "127.0.0.1:0", "-plan", "../../grid/demo/port.yaml")
	client := &http.Client{CheckRedirect: func(*http.Request, []*http.Request) error { return http.ErrUseLastResponse }}
	res, err := client.Get(base + "/")
	if err != nil {
		t.Fatal(err)
	}
	res.Body.Close()
	if loc := res.Header.Get("Location"); res.StatusCode != http.StatusSeeOther || !strings.Contains(loc, "name=Saltmarsh+port+100+MHz") {
		t.Errorf("GET /: %d to %q, want the plan given with -plan", res.StatusCode, loc)
	}
	cancel()
	if err := waitExit(t, done); err != nil {
		t.Error(err)
	}
}

func TestServeWarnsOffLoopback(t *testing.T) {
	base, stderr, cancel, done := startServe(t, "serve", "-addr", "0.0.0.0:0")
	if !strings.HasPrefix(base, "http://127.0.0.1:") {
		t.Errorf("serving %s: a server on every interface should print a loopback link", base)
	}
	if !strings.Contains(stderr.String(), "no login") {
		t.Errorf("no warning about logins on stderr:\n%s", stderr)
	}
	cancel()
	if err := waitExit(t, done); err != nil {
		t.Error(err)
	}
}

func TestServeFlags(t *testing.T) {
	_, stderr, code := runCLI(t, "", "serve", "-h")
	if code != 0 || !strings.Contains(stderr, "-addr") || !strings.Contains(stderr, "127.0.0.1:8080") || !strings.Contains(stderr, "-plan") {
		t.Errorf("serve -h: exit %d, output %q; want the flags with the default address", code, stderr)
	}
	for _, c := range []struct {
		args []string
		code int
		want string
	}{
		{[]string{"serve", "-plan", "../../grid/demo/none.yaml"}, 2, "none.yaml"},
		{[]string{"serve", "-plan", "-"}, 2, "standard input"},
		{[]string{"serve", "extra"}, 2, "no arguments"},
		{[]string{"serve", "-addr", "256.1.1.1:0"}, 1, "cannot listen on 256.1.1.1:0"},
		{[]string{"serve", "-allow-host", "planner.lan,evil/x"}, 2, `"evil/x" is not one`},
		{[]string{"serve", "-allow-host", ""}, 2, "-allow-host takes host names"},
	} {
		_, stderr, code := runCLI(t, "", c.args...)
		if code != c.code || !strings.Contains(stderr, c.want) {
			t.Errorf("%v: exit %d, stderr %q; want %d and %q", c.args, code, stderr, c.code, c.want)
		}
	}
}

// The server answers its own names and the ones -allow-host adds, and
// refuses another Host header with 421, which defeats DNS rebinding
// (issue 13).
func TestServeAllowHost(t *testing.T) {
	base, _, cancel, done := startServe(t, "serve", "-addr", "127.0.0.1:0", "-allow-host", "planner.lan, gridbox.example", "-allow-host", "third.example")
	for host, want := range map[string]int{
		"": http.StatusOK, "localhost": http.StatusOK, "planner.lan": http.StatusOK, "GRIDBOX.example:8080": http.StatusOK,
		"third.example": http.StatusOK, "rebound.example": http.StatusMisdirectedRequest,
	} {
		req, _ := http.NewRequest(http.MethodGet, base+"/static/app.css", nil)
		if host != "" {
			req.Host = host
		}
		res, err := http.DefaultClient.Do(req)
		if err != nil {
			t.Fatal(err)
		}
		res.Body.Close()
		if res.StatusCode != want {
			t.Errorf("Host %q: %d, want %d", host, res.StatusCode, want)
		}
	}
	cancel()
	if err := waitExit(t, done); err != nil {
		t.Error(err)
	}
}

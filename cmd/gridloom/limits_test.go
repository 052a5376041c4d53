package main

import (
	"bufio"
	"errors"
	"io"
	"log/slog"
	"net"
	"net/http"
	"os"
	"strings"
	"testing"
	"time"

	"gridloom/web"
)

func TestServerLimitsAreSet(t *testing.T) {
	srv := newHTTPServer(http.NotFoundHandler(), slog.New(slog.DiscardHandler), defaultLimits)
	if d := srv.ReadHeaderTimeout; d <= 0 || d > 5*time.Second {
		t.Errorf("ReadHeaderTimeout %v, want more than 0 and at most 5 s", d)
	}
	for name, d := range map[string]time.Duration{"ReadTimeout": srv.ReadTimeout, "WriteTimeout": srv.WriteTimeout, "IdleTimeout": srv.IdleTimeout} {
		if d <= 0 {
			t.Errorf("%s is %v: unset, so a client can hold a connection for ever", name, d)
		}
	}
	if srv.ReadTimeout < srv.ReadHeaderTimeout {
		t.Errorf("ReadTimeout %v is shorter than ReadHeaderTimeout %v", srv.ReadTimeout, srv.ReadHeaderTimeout)
	}
	// The app's own 414, which says what to do, must be reachable before
	// the server's bare 431.
	if n := srv.MaxHeaderBytes; n <= web.MaxQuery || n > 1<<20 {
		t.Errorf("MaxHeaderBytes %d, want more than web.MaxQuery (%d) and well under the 1 MiB default", n, web.MaxQuery)
	}
	if srv.ErrorLog == nil {
		t.Error("no ErrorLog: the server's own errors would go to the standard logger")
	}
}

// startLimited serves the real app on a loopback port through the server
// newHTTPServer builds with lim, and returns its address.
func startLimited(t *testing.T, lim serverLimits) string {
	t.Helper()
	demos, def, err := loadDemos()
	if err != nil {
		t.Fatal(err)
	}
	logger := slog.New(slog.DiscardHandler)
	srv := newHTTPServer(web.NewServer(logger, web.Config{Plan: def.Plan, Demos: demos}), logger, lim)
	ln, err := net.Listen("tcp", "127.0.0.1:0")
	if err != nil {
		t.Fatal(err)
	}
	go func() { _ = srv.Serve(ln) }()
	t.Cleanup(func() { _ = srv.Close() })
	return ln.Addr().String()
}

// short is defaultLimits with the waits cut to fit a test.
func short() serverLimits {
	lim := defaultLimits
	lim.readHeader, lim.read, lim.idle = 300*time.Millisecond, 600*time.Millisecond, 400*time.Millisecond
	return lim
}

// TestLongQueriesAndHeaders: a query over the app's limit gets its 414 and
// message; a query or header over the server's limit gets 431; neither
// harms the server.
func TestLongQueriesAndHeaders(t *testing.T) {
	addr := startLimited(t, defaultLimits)
	base := "http://" + addr
	get := func(path string, header map[string]string) (int, string) {
		t.Helper()
		req, err := http.NewRequest(http.MethodGet, base+path, nil)
		if err != nil {
			t.Fatal(err)
		}
		for k, v := range header {
			req.Header.Set(k, v)
		}
		res, err := http.DefaultClient.Do(req)
		if err != nil {
			t.Fatalf("GET %.60s…: %v", path, err)
		}
		defer res.Body.Close()
		b, _ := io.ReadAll(res.Body)
		return res.StatusCode, string(b)
	}
	status, body := get("/?name=x&pad="+strings.Repeat("a", 40<<10), nil)
	if status != http.StatusRequestURITooLong || !strings.Contains(body, "32 KiB") {
		t.Errorf("a 40 KiB query: %d %q, want 414 naming the 32 KiB limit", status, body)
	}
	for what, c := range map[string]struct {
		path   string
		header map[string]string
	}{
		"a 100 KiB query":  {"/?name=x&pad=" + strings.Repeat("a", 100<<10), nil},
		"a 100 KiB header": {"/static/app.css", map[string]string{"X-Pad": strings.Repeat("a", 100<<10)}},
		"2000 headers":     {"/static/app.css", manyHeaders(2000)},
	} {
		status, body := get(c.path, c.header)
		if status != http.StatusRequestHeaderFieldsTooLarge {
			t.Errorf("%s: %d %q, want 431", what, status, body)
		}
	}
	if status, _ := get("/static/app.css", nil); status != http.StatusOK {
		t.Errorf("after the long requests: GET /static/app.css %d, want 200", status)
	}
}

func manyHeaders(n int) map[string]string {
	h := map[string]string{}
	for i := range n {
		h["X-Pad-"+strings.Repeat("h", i%50)+string(rune('a'+i%26))+string(rune('a'+i/26%26))] = "0123456789012345678901234567890123456789"
	}
	return h
}

// TestSilentClientIsDropped: a client that opens a connection and never
// finishes its headers is dropped at the header timeout, while others are
// served meanwhile.
func TestSilentClientIsDropped(t *testing.T) {
	lim := short()
	addr := startLimited(t, lim)
	conn, err := net.Dial("tcp", addr)
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	start := time.Now()
	if _, err := io.WriteString(conn, "GET /static/app.css HTTP/1.1\r\nHost: localhost\r\nX-Slow: "); err != nil {
		t.Fatal(err)
	}
	res, err := http.Get("http://" + addr + "/static/app.css")
	if err != nil || res.StatusCode != http.StatusOK {
		t.Fatalf("another client while one is silent: %v, %v", res, err)
	}
	res.Body.Close()
	if err := waitClosed(conn, 5*time.Second); err != nil {
		t.Fatalf("the silent connection: %v", err)
	}
	if d := time.Since(start); d < lim.readHeader/2 {
		t.Errorf("dropped after %v, before the header timeout of %v", d, lim.readHeader)
	}
}

// TestSlowBodyIsCut: a body that trickles in is cut at the read timeout,
// with a 400 saying so.
func TestSlowBodyIsCut(t *testing.T) {
	lim := short()
	addr := startLimited(t, lim)
	conn, err := net.Dial("tcp", addr)
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	if _, err := io.WriteString(conn, "POST /api/v1/render HTTP/1.1\r\nHost: localhost\r\nContent-Type: application/json\r\nContent-Length: 1000\r\n\r\n{\"name\": "); err != nil {
		t.Fatal(err)
	}
	_ = conn.SetReadDeadline(time.Now().Add(5 * time.Second))
	res, err := http.ReadResponse(bufio.NewReader(conn), nil)
	if err != nil {
		t.Fatalf("no answer to a body cut short: %v", err)
	}
	b, _ := io.ReadAll(res.Body)
	if res.StatusCode != http.StatusBadRequest || !strings.Contains(string(b), "could not be read") {
		t.Errorf("a body cut short: %d %s, want 400 saying it could not be read", res.StatusCode, b)
	}
}

// TestIdleConnectionIsClosed: a kept-alive connection that sends nothing
// more is closed at the idle timeout.
func TestIdleConnectionIsClosed(t *testing.T) {
	lim := short()
	addr := startLimited(t, lim)
	conn, err := net.Dial("tcp", addr)
	if err != nil {
		t.Fatal(err)
	}
	defer conn.Close()
	if _, err := io.WriteString(conn, "GET /static/app.css HTTP/1.1\r\nHost: localhost\r\n\r\n"); err != nil {
		t.Fatal(err)
	}
	br := bufio.NewReader(conn)
	res, err := http.ReadResponse(br, nil)
	if err != nil || res.StatusCode != http.StatusOK {
		t.Fatalf("first request: %v, %v", res, err)
	}
	_, _ = io.Copy(io.Discard, res.Body)
	start := time.Now()
	if err := waitClosed(readerConn{conn, br}, 5*time.Second); err != nil {
		t.Fatalf("the idle connection: %v", err)
	}
	if d := time.Since(start); d < lim.idle/2 {
		t.Errorf("closed after %v, before the idle timeout of %v", d, lim.idle)
	}
}

// readerConn reads a connection through the bufio.Reader that already
// holds its first bytes.
type readerConn struct {
	net.Conn
	r *bufio.Reader
}

func (c readerConn) Read(p []byte) (int, error) { return c.r.Read(p) }

// waitClosed reads from conn until the server closes it, and fails if that
// takes longer than limit or the server sends anything.
func waitClosed(conn net.Conn, limit time.Duration) error {
	_ = conn.SetReadDeadline(time.Now().Add(limit))
	var buf [512]byte
	n, err := conn.Read(buf[:])
	switch {
	case errors.Is(err, os.ErrDeadlineExceeded):
		return errors.New("still open after " + limit.String())
	case n > 0:
		return errors.New("the server sent " + string(buf[:n]) + " instead of closing")
	case err == nil:
		return errors.New("a read of nothing without an error")
	}
	return nil // io.EOF or a reset: closed
}

package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"log/slog"
	"net"
	"net/http"
	"strings"
	"syscall"
	"time"

	"gridloom/grid/demo"
	"gridloom/web"
)

// serverLimits are the timeouts and limits of the web server: none is
// left at its zero value (no limit), so that a client that is slow, silent
// or oversized cannot hold a connection, a goroutine or memory for long.
type serverLimits struct {
	readHeader time.Duration // to read the request line and headers
	read       time.Duration // to read the whole request, body included
	write      time.Duration // from the end of the headers to the end of the response
	idle       time.Duration // a kept-alive connection waiting for its next request
	// maxHeaderBytes bounds the request line and headers (the server
	// answers 431 beyond it). A plan travels in the query string; the app
	// reads at most web.MaxQuery bytes of it and explains its 414 beyond
	// that, so the limit leaves room for a query of that length and the
	// usual headers.
	maxHeaderBytes int
}

// defaultLimits are the limits gridloom serves with.
var defaultLimits = serverLimits{
	readHeader:     5 * time.Second,
	read:           30 * time.Second,
	write:          60 * time.Second,
	idle:           2 * time.Minute,
	maxHeaderBytes: 2 * web.MaxQuery, // 64 KiB
}

// shutdownTimeout is how long a shutdown waits for requests in flight.
const shutdownTimeout = 10 * time.Second

// newHTTPServer returns the server that serves h within lim. The errors the
// server meets itself (accept failures, malformed connections) go to logger.
func newHTTPServer(h http.Handler, logger *slog.Logger, lim serverLimits) *http.Server {
	return &http.Server{
		Handler:           h,
		ReadHeaderTimeout: lim.readHeader,
		ReadTimeout:       lim.read,
		WriteTimeout:      lim.write,
		IdleTimeout:       lim.idle,
		MaxHeaderBytes:    lim.maxHeaderBytes,
		ErrorLog:          slog.NewLogLogger(logger.Handler(), slog.LevelWarn),
	}
}

// runServe starts the web app and serves until ctx ends, then shuts down
// gracefully and returns nil. implicit says the user named no command, as
// in "gridloom -h": the help then lists the commands too.
func runServe(ctx context.Context, args []string, stdout, stderr io.Writer, implicit bool) error {
	fs := newFlags("serve", "[-addr HOST:PORT] [-plan FILE] [-allow-host NAMES]", stderr)
	if implicit {
		fs.Usage = func() {
			fmt.Fprint(stderr, usage)
			fmt.Fprintln(stderr, "\nFlags of serve, the command run when none is named:")
			fs.PrintDefaults()
		}
	}
	addr := fs.String("addr", "127.0.0.1:8080", "listen on `HOST:PORT`; the app has no login, so keep it on a loopback address")
	planPath := fs.String("plan", "", "open with the plan in `FILE` (JSON or YAML) instead of the demo plan")
	var allowHosts []string
	fs.Func("allow-host", "also answer to the host `NAMES` (comma-separated, the flag repeatable) besides the -addr host, localhost and IP addresses; other names are refused against DNS rebinding",
		func(v string) error {
			for name := range strings.SplitSeq(v, ",") {
				name = strings.TrimSpace(name)
				if !validHostName(name) {
					return fmt.Errorf("-allow-host takes host names separated by commas, such as planner.lan; %q is not one", name)
				}
				allowHosts = append(allowHosts, name)
			}
			return nil
		})
	if err := parseFlags(fs, args); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		fs.Usage()
		return &exitError{code: exitBadInput, msg: fmt.Sprintf("serve takes no arguments, but got %q; give a plan with -plan FILE", fs.Arg(0))}
	}
	demos, def, err := loadDemos()
	if err != nil {
		return err
	}
	start := def.Plan
	if *planPath != "" {
		if *planPath == "-" {
			return &exitError{code: exitBadInput, msg: "-plan needs a file: the web app cannot read its plan from standard input"}
		}
		if start, err = readPlan(ctx, *planPath, nil, stderr); err != nil {
			return err
		}
	}

	logger := slog.New(slog.NewTextHandler(stderr, nil))
	ln, err := net.Listen("tcp", *addr)
	if err != nil {
		return &exitError{code: 1, msg: listenMessage(*addr, err)}
	}
	srv := newHTTPServer(web.NewServer(logger, web.Config{Plan: start, Demos: demos, Addr: *addr, AllowHosts: allowHosts}), logger, defaultLimits)
	if !isLoopback(ln.Addr()) {
		logger.Warn("gridloom has no login: anyone who can reach this address can use the app; listen on 127.0.0.1 to keep it to this machine",
			"addr", ln.Addr().String())
	}
	fmt.Fprintf(stdout, "gridloom: serving %s\n", serveURL(ln.Addr(), *addr))

	served := make(chan error, 1)
	go func() { served <- srv.Serve(web.SecureListener(ln)) }()
	select {
	case err := <-served:
		return &exitError{code: 1, msg: "the web server stopped: " + err.Error()}
	case <-ctx.Done():
	}
	logger.Info("shutting down")
	shutdownCtx, cancel := context.WithTimeout(context.Background(), shutdownTimeout)
	defer cancel()
	if err := srv.Shutdown(shutdownCtx); err != nil {
		return &exitError{code: 1, msg: "the web server did not shut down cleanly: " + err.Error()}
	}
	return nil
}

// validHostName reports whether s is a DNS host name (letters, digits,
// hyphens and dots, at most 253 bytes) that -allow-host can take.
func validHostName(s string) bool {
	if s == "" || len(s) > 253 {
		return false
	}
	for _, label := range strings.Split(strings.TrimSuffix(s, "."), ".") {
		if label == "" || len(label) > 63 || label[0] == '-' || label[len(label)-1] == '-' {
			return false
		}
		for _, c := range label {
			if !(c >= 'a' && c <= 'z' || c >= 'A' && c <= 'Z' || c >= '0' && c <= '9' || c == '-') {
				return false
			}
		}
	}
	return true
}

// listenMessage explains a failure to listen in one line.
func listenMessage(addr string, err error) string {
	if errors.Is(err, syscall.EADDRINUSE) {
		return fmt.Sprintf("cannot listen on %s: the address is already in use; stop the other server or choose another address with -addr", addr)
	}
	return fmt.Sprintf("cannot listen on %s: %s", addr, strings.ReplaceAll(err.Error(), "\n", " "))
}

func isLoopback(a net.Addr) bool {
	t, ok := a.(*net.TCPAddr)
	return ok && t.IP.IsLoopback()
}

// serveURL is the address to print for a listener: one a browser can open,
// so a listener on every interface is shown on loopback, of the family the
// user asked for (requested is the -addr value).
func serveURL(a net.Addr, requested string) string {
	t, ok := a.(*net.TCPAddr)
	if !ok {
		return "http://" + a.String()
	}
	host := t.IP.String()
	if t.IP == nil || t.IP.IsUnspecified() {
		host = "127.0.0.1"
		if h, _, err := net.SplitHostPort(requested); err == nil && strings.Contains(h, ":") {
			host = "::1"
		}
	}
	return "http://" + net.JoinHostPort(host, fmt.Sprint(t.Port))
}

// loadDemos decodes the embedded demo plans and returns them with the
// default one, which the app opens with.
func loadDemos() ([]web.Demo, web.Demo, error) {
	all, err := demo.All()
	if err != nil {
		return nil, web.Demo{}, err
	}
	var demos []web.Demo
	var def web.Demo
	for _, p := range all {
		d := web.Demo{Name: p.Name, Plan: p.Plan}
		demos = append(demos, d)
		if p.Name == demo.Default {
			def = d
		}
	}
	return demos, def, nil
}

package main

import (
	"context"
	"encoding/json"
	"io"
	"net"
	"net/http"
	"net/http/httptrace"
	"os"
	"os/exec"
	"path/filepath"
	"runtime"
	"strings"
	"syscall"
	"testing"
	"time"
)

// buildBinary builds the real program into a temporary folder.
func buildBinary(t *testing.T) string {
	t.Helper()
	// go test puts its own toolchain's bin first on PATH (since Go 1.19).
	goTool, err := exec.LookPath("go")
	if err != nil {
		t.Fatalf("the go command is not on PATH: %v", err)
	}
	bin := filepath.Join(t.TempDir(), "gridloom")
	out, err := exec.Command(goTool, "build", "-o", bin, ".").CombinedOutput()
	if err != nil {
		t.Fatalf("go build: %v\n%s", err, out)
	}
	return bin
}

// TestSignalDrainsRequests: SIGTERM or SIGINT stops the server from taking
// new connections but lets a request in flight finish; then the program
// exits 0. The request is a POST whose body is still arriving when the
// signal comes: the client asks for 100-continue, so the server's
// "100 Continue" proves the handler is reading the body before the signal
// is sent.
func TestSignalDrainsRequests(t *testing.T) {
	if runtime.GOOS == "windows" {
		t.Skip("no SIGTERM on Windows")
	}
	bin := buildBinary(t)
	plan, err := os.ReadFile("../../grid/demo/campus.yaml")
	if err != nil {
		t.Fatal(err)
	}
	for _, sig := range []syscall.Signal{syscall.SIGTERM, syscall.SIGINT} {
		t.Run(sig.String(), func(t *testing.T) {
			srv := startBinaryServe(t, bin)
			cmd, stderr, exited, base := srv.cmd, srv.stderr, srv.exited, srv.base
			pw, answered := holdRequest(t, base, plan)
			defer pw.Close()
			half := len(plan) / 2
			if _, err := pw.Write(plan[:half]); err != nil {
				t.Fatal(err)
			}

			if err := cmd.Process.Signal(sig); err != nil {
				t.Fatal(err)
			}
			waitFor(t, "the shutdown to start", func() bool { return strings.Contains(stderr.String(), "shutting down") })
			host := strings.TrimPrefix(base, "http://")
			waitFor(t, "the listener to close", func() bool {
				c, err := net.DialTimeout("tcp", host, time.Second)
				if err == nil {
					c.Close()
				}
				return err != nil
			})
			select {
			case err := <-exited:
				t.Fatalf("the program exited (%v) with a request in flight", err)
			default:
			}

			if _, err := pw.Write(plan[half:]); err != nil {
				t.Fatal(err)
			}
			pw.Close()
			var a answer
			select {
			case a = <-answered:
			case <-time.After(15 * time.Second):
				t.Fatal("no answer to the request in flight")
			}
			if a.err != nil {
				t.Fatalf("the request in flight failed: %v", a.err)
			}
			var doc struct {
				Partitions []json.RawMessage `json:"partitions"`
			}
			if a.res.StatusCode != http.StatusOK || json.Unmarshal(a.body, &doc) != nil || len(doc.Partitions) != 3 {
				t.Errorf("the request in flight: %d %.200s; want 200 and the campus plan's document", a.res.StatusCode, a.body)
			}

			select {
			case err := <-exited:
				if err != nil {
					t.Errorf("the program exited with %v, want 0; stderr:\n%s", err, stderr)
				}
			case <-time.After(15 * time.Second):
				t.Fatal("the program did not exit after the request finished")
			}
			if s := stderr.String(); strings.Contains(s, "did not shut down cleanly") || !strings.Contains(s, "status=200") {
				t.Errorf("stderr:\n%s", s)
			}
		})
	}
}

// served is a running "gridloom serve" on a free loopback port.
type served struct {
	cmd            *exec.Cmd
	stdout, stderr *syncBuffer
	exited         chan error // receives cmd.Wait's error when the program ends
	base           string     // http://host:port
}

// startBinaryServe starts the binary's server and waits for its serving line.
func startBinaryServe(t *testing.T, bin string) served {
	t.Helper()
	s := served{cmd: exec.Command(bin, "serve", "-addr", "127.0.0.1:0"), stdout: &syncBuffer{}, stderr: &syncBuffer{}, exited: make(chan error, 1)}
	s.cmd.Stdout, s.cmd.Stderr = s.stdout, s.stderr
	if err := s.cmd.Start(); err != nil {
		t.Fatal(err)
	}
	go func() { s.exited <- s.cmd.Wait() }()
	t.Cleanup(func() {
		if s.cmd.ProcessState == nil {
			_ = s.cmd.Process.Kill()
			<-s.exited
		}
	})
	waitFor(t, "the serving line", func() bool {
		m := servingLine.FindStringSubmatch(s.stdout.String())
		if m != nil {
			s.base = m[1]
		}
		return m != nil
	})
	return s
}

// answer is the end of a request.
type answer struct {
	res  *http.Response
	body []byte
	err  error
}

// holdRequest starts a POST of a plan to the API whose body the test
// writes through the returned pipe, and returns once the handler has
// asked for the body: the client asks for 100-continue, so the server's
// "100 Continue" proves the handler is reading.
func holdRequest(t *testing.T, base string, plan []byte) (*io.PipeWriter, chan answer) {
	t.Helper()
	pr, pw := io.Pipe()
	continued := make(chan struct{})
	ctx := httptrace.WithClientTrace(context.Background(), &httptrace.ClientTrace{
		Got100Continue: func() { close(continued) },
	})
	req, err := http.NewRequestWithContext(ctx, http.MethodPost, base+"/api/v1/render", pr)
	if err != nil {
		t.Fatal(err)
	}
	req.Header.Set("Content-Type", "application/yaml")
	req.Header.Set("Expect", "100-continue")
	client := &http.Client{Transport: &http.Transport{ExpectContinueTimeout: 30 * time.Second}}
	answered := make(chan answer, 1)
	go func() {
		res, err := client.Do(req)
		if err != nil {
			answered <- answer{err: err}
			return
		}
		defer res.Body.Close()
		b, err := io.ReadAll(res.Body)
		answered <- answer{res, b, err}
	}()
	select {
	case <-continued:
	case a := <-answered:
		t.Fatalf("the request ended before its body was asked for: %v, %v", a.res, a.err)
	case <-time.After(10 * time.Second):
		t.Fatal("no 100 Continue: the handler never started to read the body")
	}
	return pw, answered
}

// A second Ctrl-C or SIGTERM during the drain ends the program at once,
// with the status a shell reports for a program the signal ended, instead
// of waiting up to shutdownTimeout for the request in flight.
func TestSecondSignalStopsDrain(t *testing.T) {
	if runtime.GOOS == "windows" {
		t.Skip("no SIGTERM on Windows")
	}
	bin := buildBinary(t)
	plan, err := os.ReadFile("../../grid/demo/campus.yaml")
	if err != nil {
		t.Fatal(err)
	}
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		t.Run(sig.String(), func(t *testing.T) {
			srv := startBinaryServe(t, bin)
			pw, _ := holdRequest(t, srv.base, plan)
			defer pw.Close()
			if err := srv.cmd.Process.Signal(sig); err != nil {
				t.Fatal(err)
			}
			waitFor(t, "the shutdown to start", func() bool { return strings.Contains(srv.stderr.String(), "shutting down") })
			sent := time.Now()
			if err := srv.cmd.Process.Signal(sig); err != nil {
				t.Fatal(err)
			}
			select {
			case <-srv.exited:
			case <-time.After(shutdownTimeout / 2):
				t.Fatalf("still running %v after the second %v; stderr:\n%s", shutdownTimeout/2, sig, srv.stderr)
			}
			if got, want := srv.cmd.ProcessState.ExitCode(), 128+int(sig); got != want {
				t.Errorf("exit status %d after %v, want %d; stderr:\n%s", got, time.Since(sent), want, srv.stderr)
			}
			if !strings.Contains(srv.stderr.String(), "stopping at once") {
				t.Errorf("stderr does not say it stops at once:\n%s", srv.stderr)
			}
		})
	}
}

// Ctrl-C or SIGTERM ends "check -" while it waits on standard input,
// with 130 or 143 as documented. The signal is sent after a pause so that
// the program has installed its handler; should it come before, the
// runtime would end the program by the signal itself and the test tries
// again.
func TestSignalEndsCheckWaitingOnStdin(t *testing.T) {
	if runtime.GOOS == "windows" {
		t.Skip("no SIGTERM on Windows")
	}
	bin := buildBinary(t)
	for _, sig := range []syscall.Signal{syscall.SIGINT, syscall.SIGTERM} {
		t.Run(sig.String(), func(t *testing.T) {
			for attempt := 1; ; attempt++ {
				cmd := exec.Command(bin, "check", "-")
				stdin, err := cmd.StdinPipe() // held open: the program waits for more
				if err != nil {
					t.Fatal(err)
				}
				defer stdin.Close()
				stderr := &syncBuffer{}
				cmd.Stderr = stderr
				if err := cmd.Start(); err != nil {
					t.Fatal(err)
				}
				exited := make(chan error, 1)
				go func() { exited <- cmd.Wait() }()
				if _, err := io.WriteString(stdin, "name: half a plan\n"); err != nil {
					t.Fatal(err)
				}
				time.Sleep(200 * time.Millisecond)
				if err := cmd.Process.Signal(sig); err != nil {
					t.Fatal(err)
				}
				select {
				case <-exited:
				case <-time.After(5 * time.Second):
					_ = cmd.Process.Kill()
					<-exited
					t.Fatalf("check - still waiting on standard input 5 s after %v", sig)
				}
				ws, _ := cmd.ProcessState.Sys().(syscall.WaitStatus)
				if ws.Signaled() && attempt < 3 {
					continue // the signal came before the handler
				}
				if got, want := cmd.ProcessState.ExitCode(), 128+int(sig); got != want || !strings.Contains(stderr.String(), "interrupted while reading standard input") {
					t.Errorf("exit %d, stderr %q; want %d and a message", got, stderr, want)
				}
				return
			}
		})
	}
}

// waitFor polls cond for up to 10 s.
func waitFor(t *testing.T, what string, cond func() bool) {
	t.Helper()
	for deadline := time.Now().Add(10 * time.Second); time.Now().Before(deadline); time.Sleep(10 * time.Millisecond) {
		if cond() {
			return
		}
	}
	t.Fatalf("waited 10 s for %s", what)
}

// run itself: check and render give up on an input that never ends when
// their context ends, with the status of the signal that ended it.
func TestReadPlanHonoursContext(t *testing.T) {
	for _, args := range [][]string{{"check", "-"}, {"render", "-format", "json", "-"}} {
		t.Run(args[0], func(t *testing.T) {
			pr, pw := io.Pipe()
			defer pw.Close()
			ctx, cancel := context.WithCancelCause(context.Background())
			done := make(chan int, 1)
			var out, errOut syncBuffer
			go func() {
				done <- exitCode(run(ctx, args, pr, &out, &errOut), &errOut)
			}()
			if _, err := pw.Write([]byte("name: half a plan\n")); err != nil { // read, so run is waiting for more
				t.Fatal(err)
			}
			cancel(signalCause{syscall.SIGTERM})
			select {
			case code := <-done:
				if code != 143 || !strings.Contains(errOut.String(), "interrupted while reading standard input") {
					t.Errorf("exit %d, stderr %q; want 143 and a message", code, errOut.String())
				}
			case <-time.After(5 * time.Second):
				t.Fatal("run still reading 5 s after its context ended")
			}
		})
	}
}

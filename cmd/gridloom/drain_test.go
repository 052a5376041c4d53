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
			cmd := exec.Command(bin, "serve", "-addr", "127.0.0.1:0")
			stdout, stderr := &syncBuffer{}, &syncBuffer{}
			cmd.Stdout, cmd.Stderr = stdout, stderr
			if err := cmd.Start(); err != nil {
				t.Fatal(err)
			}
			exited := make(chan error, 1)
			go func() { exited <- cmd.Wait() }()
			t.Cleanup(func() {
				if cmd.ProcessState == nil {
					_ = cmd.Process.Kill()
					<-exited
				}
			})
			var base string
			waitFor(t, "the serving line", func() bool {
				m := servingLine.FindStringSubmatch(stdout.String())
				if m != nil {
					base = m[1]
				}
				return m != nil
			})

			pr, pw := io.Pipe()
			defer pw.Close()
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
			type answer struct {
				res  *http.Response
				body []byte
				err  error
			}
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

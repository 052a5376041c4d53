// Command floor is the floor of gridloom's HTTP stack: it fetches one
// response from a running gridloom (as a browser asks for it, gzip
// accepted) and then answers every request with that response again, its
// status, headers and body byte for byte, doing nothing else. Whatever
// gridloom's own answer costs above floor's is the cost of computing it.
//
// It lives under testdata, so ./... leaves it out; run it with go run:
//
//	go run ./cmd/gridloom serve -addr 127.0.0.1:8080 2>/dev/null &
//	go run ./testdata/floor -from "http://127.0.0.1:8080/figure.svg?$Q" -addr 127.0.0.1:8081 &
//	wrk -t2 -c16 -d20s -H 'Accept-Encoding: gzip' "http://127.0.0.1:8080/figure.svg?$Q"
//	wrk -t2 -c16 -d20s -H 'Accept-Encoding: gzip' "http://127.0.0.1:8081/figure.svg?$Q"
//
// DEVELOPERS.md ("Performance") has the whole recipe and the numbers.
package main

import (
	"context"
	"errors"
	"flag"
	"fmt"
	"io"
	"net/http"
	"os"
	"os/signal"
	"time"
)

func main() {
	if err := run(context.Background(), os.Args[1:], os.Stderr); err != nil {
		fmt.Fprintln(os.Stderr, "floor:", err)
		os.Exit(1)
	}
}

func run(ctx context.Context, args []string, stderr io.Writer) error {
	ctx, stop := signal.NotifyContext(ctx, os.Interrupt)
	defer stop()
	fs := flag.NewFlagSet("floor", flag.ContinueOnError)
	fs.SetOutput(stderr)
	from := fs.String("from", "", "URL of the response to replay, fetched once at start")
	addr := fs.String("addr", "127.0.0.1:8081", "address to listen on")
	gzip := fs.Bool("gzip", true, "fetch with Accept-Encoding: gzip, as a browser does")
	if err := fs.Parse(args); err != nil {
		return err
	}
	if *from == "" {
		return errors.New("give -from, the URL of the response to replay")
	}
	status, header, body, err := fetch(ctx, *from, *gzip)
	if err != nil {
		return err
	}
	h := http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		wh := w.Header()
		for k, v := range header {
			wh[k] = v
		}
		w.WriteHeader(status)
		_, _ = w.Write(body)
	})
	srv := &http.Server{Addr: *addr, Handler: h, ReadHeaderTimeout: 10 * time.Second}
	fmt.Fprintf(stderr, "floor: replaying %d bytes (status %d, %s, Content-Encoding %q) on http://%s/\n",
		len(body), status, header.Get("Content-Type"), header.Get("Content-Encoding"), *addr)
	errc := make(chan error, 1)
	go func() { errc <- srv.ListenAndServe() }()
	select {
	case err := <-errc:
		return err
	case <-ctx.Done():
		shut, cancel := context.WithTimeout(context.Background(), 5*time.Second)
		defer cancel()
		return srv.Shutdown(shut)
	}
}

// fetch gets url once and returns the response as sent: no decompression.
func fetch(ctx context.Context, url string, gzip bool) (int, http.Header, []byte, error) {
	req, err := http.NewRequestWithContext(ctx, http.MethodGet, url, nil)
	if err != nil {
		return 0, nil, nil, err
	}
	if gzip {
		req.Header.Set("Accept-Encoding", "gzip")
	}
	client := &http.Client{Transport: &http.Transport{DisableCompression: true}, Timeout: time.Minute}
	res, err := client.Do(req)
	if err != nil {
		return 0, nil, nil, err
	}
	defer res.Body.Close()
	body, err := io.ReadAll(res.Body)
	if err != nil {
		return 0, nil, nil, err
	}
	header := res.Header.Clone()
	for _, k := range []string{"Date", "Content-Length", "Transfer-Encoding", "X-Request-Id"} {
		header.Del(k) // net/http writes its own
	}
	return res.StatusCode, header, body, nil
}

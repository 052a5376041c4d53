package web

import (
	"cmp"
	"fmt"
	"log/slog"
	"net"
	"net/http"
	"net/netip"
	"runtime/debug"
	"strings"
	"time"

	"github.com/go-chi/chi/v5/middleware"
)

// securityHeaderList is what every answer carries, those of the app and
// those net/http writes itself (see SecureListener). Another site's page
// may not embed the app's answers (a figure, a download) as images or
// scripts, by Cross-Origin-Resource-Policy: it would read a plan through
// them.
var securityHeaderList = [][2]string{
	{"Content-Security-Policy", basePolicy},
	{"X-Content-Type-Options", "nosniff"},
	{"Referrer-Policy", "no-referrer"},
	{"X-Frame-Options", "DENY"},
	{"Cross-Origin-Opener-Policy", "same-origin"},
	{"Cross-Origin-Resource-Policy", "same-origin"},
}

func securityHeaders(next http.Handler) http.Handler {
	return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
		h := w.Header()
		for _, kv := range securityHeaderList {
			h.Set(kv[0], kv[1])
		}
		next.ServeHTTP(w, r)
	})
}

// limitBody stops reading a body at the limit; the handlers turn the read
// error into 413. A body whose declared length is over the limit is refused
// at once, except an upload, whose handler answers with the page and the
// reason beside the file control.
func (s *server) limitBody(style errorStyle) func(http.Handler) http.Handler {
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			limit := int64(maxBody)
			upload := strings.HasPrefix(r.Header.Get("Content-Type"), "multipart/form-data")
			if upload {
				limit = maxUploadBody
			}
			if r.ContentLength > limit && !upload {
				s.answer(w, r, style, tooLarge(limit))
				return
			}
			r.Body = http.MaxBytesReader(w, r.Body, limit)
			next.ServeHTTP(w, r)
		})
	}
}

// MaxQuery is the longest query, in bytes, that the app reads; a longer
// one gets 414. A link holds the whole plan: the longest a plan within the
// engine's limits can write (16 partitions, every name 64 four-byte
// characters, every field given) is under 16 KiB, so 32 KiB leaves room for
// plans over the limits, which the page must still show to say what is
// wrong. The server in front must allow headers of more than MaxQuery bytes
// for the 414 and its message to be reached; the handler bounds its work
// without relying on it.
const MaxQuery = 32 << 10

// limitQuery refuses a query longer than MaxQuery with 414, before any
// handler parses it, saying how long it was and what the limit is.
func (s *server) limitQuery(style errorStyle) func(http.Handler) http.Handler {
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			if n := len(r.URL.RawQuery); n > MaxQuery {
				s.answer(w, r, style, &problem{status: http.StatusRequestURITooLong,
					text: fmt.Sprintf("The link's query is %d bytes long; gridloom reads at most %d (32 KiB). A plan this large travels better as a plan file: open it under \"Open a plan file\".", n, MaxQuery)})
				return
			}
			next.ServeHTTP(w, r)
		})
	}
}

// statusClientClosed is logged for a request whose client went away before
// it was answered (nginx's 499); it is never sent.
const statusClientClosed = 499

// accessLog writes one structured line per request. The query is logged by
// size only: it holds a whole plan.
func accessLog(logger *slog.Logger) func(http.Handler) http.Handler {
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			ww := middleware.NewWrapResponseWriter(w, r.ProtoMajor)
			start := time.Now()
			next.ServeHTTP(ww, r)
			status := ww.Status()
			if status == 0 && r.Context().Err() != nil {
				status = statusClientClosed
			}
			logger.LogAttrs(r.Context(), slog.LevelInfo, "request",
				slog.String("id", middleware.GetReqID(r.Context())),
				slog.String("method", r.Method),
				slog.String("path", r.URL.Path),
				slog.Int("query_bytes", len(r.URL.RawQuery)),
				slog.Int("status", cmp.Or(status, http.StatusOK)),
				slog.Int("bytes", ww.BytesWritten()),
				slog.Duration("duration", time.Since(start)),
			)
		})
	}
}

// recoverPanics turns a panic in a handler into a logged 500, so that one
// bad request cannot take the app down.
func (s *server) recoverPanics(style errorStyle) func(http.Handler) http.Handler {
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			defer func() {
				v := recover()
				if v == nil {
					return
				}
				if v == http.ErrAbortHandler {
					panic(v)
				}
				s.logger.LogAttrs(r.Context(), slog.LevelError, "panic",
					slog.String("id", middleware.GetReqID(r.Context())),
					slog.Any("value", v), slog.String("stack", string(debug.Stack())))
				s.answer(w, r, style, &problem{status: http.StatusInternalServerError, text: "Internal error; the log has the details."})
			}()
			next.ServeHTTP(w, r)
		})
	}
}

// checkHost answers only requests whose Host names the app: the host of
// addr, localhost and names under .localhost (RFC 6761), any IP address,
// and the names in allow. A name a foreign site controls is refused with
// 421 (Misdirected Request): after DNS rebinding, that site's pages are
// same-origin with the app and could otherwise read and drive it. An IP
// address is safe to answer, since a page can only be same-origin with it
// by being served from it.
func (s *server) checkHost(addr string, allow []string) func(http.Handler) http.Handler {
	names := map[string]bool{}
	if host, _, err := net.SplitHostPort(addr); err == nil && host != "" {
		names[hostName(host)] = true
	}
	for _, a := range allow {
		names[hostName(a)] = true
	}
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			host := r.Host
			if h, _, err := net.SplitHostPort(host); err == nil {
				host = h
			}
			host = hostName(host)
			_, ipErr := netip.ParseAddr(host)
			if host == "" || ipErr == nil || host == "localhost" || strings.HasSuffix(host, ".localhost") || names[host] {
				next.ServeHTTP(w, r)
				return
			}
			s.answer(w, r, pageErrors, &problem{status: http.StatusMisdirectedRequest,
				text: fmt.Sprintf("gridloom does not answer to the host name %q; it answers to localhost, IP addresses and the names given to gridloom serve -allow-host.", truncate(host, 100))})
		})
	}
}

// hostName is a host as compared: lower case, without brackets or a
// final dot.
func hostName(h string) string {
	return strings.TrimSuffix(strings.ToLower(strings.Trim(h, "[]")), ".")
}

func truncate(s string, n int) string {
	if len(s) <= n {
		return s
	}
	return s[:n] + "…"
}

// sameOrigin refuses a request that changes or computes something (a POST)
// when a browser says it comes from another site, by Sec-Fetch-Site or,
// in older browsers, Origin: without it any web page could post a plan
// to the app (a form or a text/plain fetch needs no permission). Requests
// without those headers (curl, scripts) pass.
//
// A GET or HEAD passes too when it opens a page (a link followed from
// anywhere is how plans are shared), but not when another site's page
// loads it as a part of itself, an <img> of the widest PNG say: the
// answer's Cross-Origin-Resource-Policy would keep that page from using
// it, yet the server would have drawn it. Fetch Metadata (W3C): such a
// load says Sec-Fetch-Site cross-site or same-site and a Sec-Fetch-Mode
// other than navigate.
func (s *server) sameOrigin(style errorStyle) func(http.Handler) http.Handler {
	check := http.NewCrossOriginProtection()
	return func(next http.Handler) http.Handler {
		return http.HandlerFunc(func(w http.ResponseWriter, r *http.Request) {
			if err := check.Check(r); err != nil {
				s.answer(w, r, style, &problem{status: http.StatusForbidden,
					text: fmt.Sprintf("%s %s came from another site's page; gridloom takes plans only from its own pages and from programs that are not browsers.", r.Method, r.URL.Path)})
				return
			}
			if site := r.Header.Get("Sec-Fetch-Site"); (site == "cross-site" || site == "same-site") && r.Header.Get("Sec-Fetch-Mode") != "navigate" {
				s.answer(w, r, style, &problem{status: http.StatusForbidden,
					text: fmt.Sprintf("%s %s was asked for by another site's page; gridloom answers its own pages, links opened from anywhere and programs that are not browsers.", r.Method, r.URL.Path)})
				return
			}
			next.ServeHTTP(w, r)
		})
	}
}

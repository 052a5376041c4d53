package web

import (
	"bytes"
	"errors"
	"fmt"
	"log/slog"
	"net/http"
	"slices"
	"strings"

	"github.com/go-chi/chi/v5"
	"github.com/go-chi/chi/v5/middleware"
)

// Handlers return an error instead of writing one: a *problem says what
// the answer is, anything else is an internal error. One place, answer,
// turns either into the response, in the style of the route group: text
// (or the not-found page) for the pages and downloads, JSON for the API.

// errorStyle is how a route group answers an error.
type errorStyle int

const (
	pageErrors errorStyle = iota // plain text, and the not-found page for 404
	apiErrors                    // a JSON body {"error": …, "fields": […]}
)

// apiError is the body of an API error: one sentence, and the fields it
// concerns, by plan path.
type apiError struct {
	Error  string         `json:"error"`
	Fields []problemField `json:"fields,omitempty"`
}

// handlerFunc is a handler that returns its failure instead of writing it.
type handlerFunc func(w http.ResponseWriter, r *http.Request) error

// serve adapts h, answering its error in the given style.
func (s *server) serve(style errorStyle, h handlerFunc) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		if err := h(w, r); err != nil {
			s.answer(w, r, style, err)
		}
	}
}

// answer writes the response an error deserves. An error that is not a
// *problem is internal; a request whose client has gone gets no answer.
func (s *server) answer(w http.ResponseWriter, r *http.Request, style errorStyle, err error) {
	var p *problem
	if !errors.As(err, &p) {
		if r.Context().Err() != nil {
			return // the client went away: no one to answer, nothing broken
		}
		p = internal("answer", err)
	}
	if p.status >= 500 && p.err != nil {
		s.logger.LogAttrs(r.Context(), slog.LevelError, p.what, slog.String("id", middleware.GetReqID(r.Context())), slog.Any("err", p.err))
	}
	h := w.Header()
	h.Del("Content-Disposition")
	h.Del("Content-Encoding")
	switch {
	case style == apiErrors:
		if sendJSON(w, r, p.status, apiError{Error: p.text, Fields: p.fields}) != nil {
			send(w, r, http.StatusInternalServerError, "text/plain; charset=utf-8", []byte("Internal error: the response could not be encoded.\n"))
		}
	case p.status == http.StatusNotFound:
		var buf bytes.Buffer
		if notFoundPage(r.URL.Path).Render(r.Context(), &buf) != nil {
			buf.Reset()
			buf.WriteString("Not found.\n")
		}
		send(w, r, p.status, "text/html; charset=utf-8", buf.Bytes())
	default:
		send(w, r, p.status, "text/plain; charset=utf-8", []byte(p.text+"\n"))
	}
}

// notFound answers an unknown path.
func (s *server) notFound(style errorStyle) http.HandlerFunc {
	return s.serve(style, func(w http.ResponseWriter, r *http.Request) error {
		return &problem{status: http.StatusNotFound, text: notFoundText(style, r.URL.Path)}
	})
}

func notFoundText(style errorStyle, path string) string {
	if style == apiErrors {
		return fmt.Sprintf("There is no %s; the API has POST /api/v1/render and POST /api/v1/figure.", path)
	}
	return "There is no " + path + "."
}

// methodNotAllowed answers 405 with the Allow header listing the methods
// the path has in routes.
func (s *server) methodNotAllowed(style errorStyle, routes chi.Routes) http.HandlerFunc {
	methods := []string{http.MethodGet, http.MethodHead, http.MethodPost, http.MethodPut, http.MethodPatch, http.MethodDelete, http.MethodOptions}
	return s.serve(style, func(w http.ResponseWriter, r *http.Request) error {
		path := r.URL.Path
		if rctx := chi.RouteContext(r.Context()); rctx != nil && rctx.RoutePath != "" {
			path = rctx.RoutePath // within a route group, the path below its prefix
		}
		var allow []string
		for _, m := range methods {
			if routes.Match(chi.NewRouteContext(), m, path) {
				allow = append(allow, m)
			}
		}
		if len(allow) == 0 { // an unknown method on an unknown path: the path is what is wrong
			return &problem{status: http.StatusNotFound, text: notFoundText(style, r.URL.Path)}
		}
		if slices.Contains(allow, http.MethodGet) && !slices.Contains(allow, http.MethodHead) {
			allow = append(allow, http.MethodHead)
		}
		w.Header().Set("Allow", strings.Join(allow, ", "))
		return &problem{status: http.StatusMethodNotAllowed,
			text: fmt.Sprintf("%s is not allowed on %s; use %s.", r.Method, r.URL.Path, strings.Join(allow, " or "))}
	})
}

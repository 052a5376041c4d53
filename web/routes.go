package web

import (
	"log/slog"
	"net/http"

	"github.com/go-chi/chi/v5"
	"github.com/go-chi/chi/v5/middleware"
)

// addRoutes is the app's whole surface. Every page route takes the plan in
// its query string (see Form); the API takes a plan file as the body.
func addRoutes(r *chi.Mux, logger *slog.Logger, cfg Config) {
	figures := newResponseCache(maxCachedFigures, maxCachedBytes)
	r.Use(middleware.RequestID)
	r.Use(accessLog(logger))
	r.Use(recoverPanics(logger))
	r.Use(securityHeaders)
	r.Use(middleware.Compress(compressLevel, compressible...))
	r.Use(limitQuery)
	r.Use(limitBody)
	r.Use(middleware.GetHead)

	r.NotFound(handleNotFound())
	r.MethodNotAllowed(handleMethodNotAllowed(r))

	r.Get("/", handlePage(logger, cfg))                                                 // the planner; an empty query opens the startup plan
	r.Get("/fragment", handleFragment(logger, cfg))                                     // the planner's workspace alone, for live updates
	r.Get("/demo/{name}", handleDemo(cfg))                                              // redirect to a demo plan
	r.Method(http.MethodGet, "/figure.svg", cached(figures, handleFigure(logger, cfg))) // the figure, with the plan in its metadata; download=1 sends it as a file
	r.Get("/figure.png", handleFigurePNG(logger, cfg))                                  // the figure as a PNG image; download=1 sends it as a file
	r.Get("/walk", handleWalk(logger, cfg))                                             // the plan step by step for a team: step=, view=projector or print
	r.Get("/compare", handleCompare(logger, cfg))                                       // two plans side by side on shared scales, a. and b. keys
	r.Get("/compare/fragment", handleCompareFragment(logger, cfg))                      // the comparison's workspace alone, for live updates
	r.Get("/compare/figure.svg", handleCompareFigure(logger, cfg, "svg"))               // one side's figure on the shared scales: side=a or b
	r.Get("/compare/figure.png", handleCompareFigure(logger, cfg, "png"))               // the same as a PNG image
	r.Get("/plan.json", handlePlanFile(logger, "json"))                                 // the plan as a JSON plan file
	r.Get("/plan.yaml", handlePlanFile(logger, "yaml"))                                 // the plan as a YAML plan file
	r.Get("/symbols.csv", handleSymbols(logger, cfg))                                   // one row per OFDM symbol of every partition
	r.Post("/open", handleOpen(logger, cfg))                                            // upload a plan file and redirect to its page
	r.Post("/api/v1/render", handleAPIRender(logger))                                   // plan JSON in, the lattice document out
	r.Post("/api/v1/figure", handleAPIFigure(logger, cfg))                              // plan JSON in, the figure out
	r.Method(http.MethodGet, "/static/*", http.StripPrefix("/static", staticHandler())) // embedded script, stylesheet and icon
}

package web

import (
	"cmp"
	"log/slog"
	"net/http"

	"gridloom/render"

	"github.com/go-chi/chi/v5"
	"github.com/go-chi/chi/v5/middleware"
)

// NewServer returns the app's handler: the router with its middleware and
// every route of routes.go.
func NewServer(logger *slog.Logger, cfg Config) http.Handler {
	if cfg.Figure == nil {
		cfg.Figure = render.Figure
	}
	if cfg.PNG == nil {
		cfg.PNG = render.FigurePNG
	}
	if cfg.SymbolCSV == nil {
		cfg.SymbolCSV = render.SymbolCSV
	}
	figures := newResponseCache(maxCachedFigures, maxCachedBytes)
	if cfg.PaceRate >= 0 {
		figures.pace = newPacer(cmp.Or(cfg.PaceRate, defaultPaceRate))
	}
	s := &server{logger: logger, cfg: cfg, figures: figures, assets: newAssets(),
		heavy: newAdmission(cmp.Or(cfg.HeavySlots, defaultHeavySlots()), cmp.Or(cfg.HeavyWait, defaultHeavyWait))}
	r := chi.NewRouter()
	s.routes(r)
	return r
}

// routes is the app's whole surface. Every page route takes the plan in
// its query string (see planform.Form); the API takes a plan file as the
// body. The pages and the API are two groups, each with its own limits,
// panic recovery, 404 and 405 in its own style of error (text or JSON).
func (s *server) routes(r *chi.Mux) {
	r.Use(middleware.RequestID)
	r.Use(accessLog(s.logger))
	r.Use(securityHeaders)
	r.Use(s.checkHost(s.cfg.Addr, s.cfg.AllowHosts))
	r.Use(middleware.GetHead)

	r.Route("/api", func(r chi.Router) {
		r.Use(s.recoverPanics(apiErrors), s.sameOrigin(apiErrors), s.limitQuery(apiErrors), s.limitBody(apiErrors))
		r.NotFound(s.notFound(apiErrors))
		r.MethodNotAllowed(s.methodNotAllowed(apiErrors, r))
		api := func(h handlerFunc) http.HandlerFunc { return s.serve(apiErrors, s.heavy.heavy(h)) }
		r.Post("/v1/render", api(s.apiRender))   // plan JSON or YAML in, the lattice document out, streamed
		r.Post("/v1/figure", api(s.apiFigure))   // plan JSON or YAML in, the figure out
		r.Post("/v1/asn1", api(s.apiASN1))       // a plan in, its TS 38.331 value notation out
		r.Post("/v1/ssb", api(s.apiSSB))         // plan in, the GSCNs where its SS/PBCH block fits (band= to choose the band)
		r.Post("/v1/initial", api(s.apiInitial)) // plan in, the ranked initial-access settings (band= to choose the band)
		r.Post("/v1/prach", api(s.apiPRACH))     // plan JSON or YAML in, the PRACH finder's document out
	})

	r.Group(func(r chi.Router) {
		r.Use(s.recoverPanics(pageErrors), s.sameOrigin(pageErrors), s.limitQuery(pageErrors), s.limitBody(pageErrors))
		page := func(h handlerFunc) http.HandlerFunc { return s.serve(pageErrors, h) }
		heavy := func(h handlerFunc) http.HandlerFunc { return page(s.heavy.heavy(h)) }
		printed := func(r *http.Request) bool { return r.URL.Query().Get("view") == "print" }
		r.Get("/", page(s.planner))                                           // the planner; an empty query opens the startup plan
		r.Get("/fragment", page(s.plannerFragment))                           // the planner's workspace alone, for live updates
		r.Get("/demo/{name}", page(s.demo))                                   // redirect to a demo plan
		r.Get("/new", page(s.newPlan))                                        // redirect to an empty carrier to start from (planform.NewPlan)
		r.Get("/figure.svg", cached(s.figures, page(s.figureSVG)).ServeHTTP)  // the figure, with the plan in its metadata; download=1 sends it as a file
		r.Get("/figure.png", cached(s.figures, heavy(s.figurePNG)).ServeHTTP) // the figure as a PNG image; download=1 sends it as a file
		r.Get("/find/ssb", heavy(s.findSSBPage))                              // the SS/PBCH block's places on the sync raster, each a link applying it
		r.Get("/find/initial", heavy(s.findInitialPage))                      // the ranked initial-access settings, each a link applying it
		r.Get("/walk", page(s.heavy.heavyWhen(printed, s.walk)))              // the plan step by step for a team: step=, view=projector or print
		r.Get("/compare", heavy(s.compare))                                   // two plans side by side on shared scales, a. and b. keys
		r.Get("/compare/fragment", heavy(s.compareFragment))                  // the comparison's workspace alone, for live updates
		r.Post("/compare/open", heavy(s.compareOpen))                         // upload a plan file into one side (side=a or b) of the comparison in the query
		r.Get("/compare/figure.svg", heavy(s.compareFigure("svg")))           // one side's figure on the shared scales: side=a or b
		r.Get("/compare/figure.png", heavy(s.compareFigure("png")))           // the same as a PNG image
		r.Get("/prach", heavy(s.prachFind))                                   // the PRACH configuration finder: every index that fits, each a link that applies it
		r.Get("/plan.json", page(s.planFile("json")))                         // the plan as a JSON plan file
		r.Get("/plan.yaml", page(s.planFile("yaml")))                         // the plan as a YAML plan file
		r.Get("/symbols.csv", heavy(s.symbols))                               // one row per OFDM symbol of every partition, streamed
		r.Get("/plan.asn", page(s.planASN))                                   // the plan as TS 38.331 value notation; download=1 sends it as a file
		r.Post("/open", page(s.open))                                         // upload a plan file and redirect to its page, or show it when its link would be over MaxQuery
		r.Get("/static/*", page(s.assets.serve))                              // embedded script, stylesheet and icon
	})
	r.NotFound(s.notFound(pageErrors))
	r.MethodNotAllowed(s.methodNotAllowed(pageErrors, r))
}

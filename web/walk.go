package web

import (
	"fmt"
	"log/slog"
	"net/http"
	"net/url"
	"slices"
	"strconv"
	"strings"

	"github.com/go-chi/chi/v5/middleware"

	"gridloom/grid"
	"gridloom/render"
)

// Query keys of the walkthrough, beside the plan's and the figure's.
const (
	keyStep = "step" // the step shown: its number from 1, or its key
	keyView = "view" // the layout: "" (the page), "projector" or "print"
)

// The walkthrough's layouts.
const (
	viewPage      = ""
	viewProjector = "projector"
	viewPrint     = "print"
)

// highlightClass maps a step's highlight targets (see WalkStep) to the
// classes of the figure's wrapper that app.css keys the dimming on: "gl-hl"
// and one "gl-hl-…" per target, or "" when the step highlights nothing.
// Only the targets listed here reach the page, so no text of the plan ever
// becomes a class.
func highlightClass(targets []string) string {
	classes := []string{}
	for _, t := range targets {
		switch t {
		case "channel", "guards", "carriers", "align", "longcp", "tdd", "ssb":
			classes = append(classes, "gl-hl-"+t)
		default:
			if s, ok := strings.CutPrefix(t, "part:"); ok {
				if i, ok := index(s); ok && i < grid.MaxPartitions {
					classes = append(classes, "gl-hl-part-"+strconv.Itoa(i))
				}
			}
		}
	}
	if len(classes) == 0 {
		return ""
	}
	return "gl-hl " + strings.Join(classes, " ")
}

// walkView is the walkthrough page.
type walkView struct {
	Title     string // the document title
	PlanTitle string // the plan's name, or "Untitled plan"
	View      string
	Status    int
	Steps     []walkStepView
	Current   int    // index in Steps
	Figure    string // the inline figure, on the page and the projector
	FigureErr string
	Notes     []note // what the link holds that the walkthrough cannot use
	// Links: back to the planner, the other layouts, and the comparison.
	Planner, Page, Projector, Print string
}

type walkStepView struct {
	Number    int
	Key       string
	Title     string
	Narration []string
	Highlight string // the figure wrapper's classes at this step
	Href      string // the link that opens the walkthrough at this step
	Figure    string // print layout only: this step's own figure
}

// cur is the step shown.
func (v walkView) cur() walkStepView { return v.Steps[v.Current] }

// prev and next are the neighbouring steps' links, or "" at the ends.
func (v walkView) prev() string {
	if v.Current == 0 {
		return ""
	}
	return v.Steps[v.Current-1].Href
}

func (v walkView) next() string {
	if v.Current+1 >= len(v.Steps) {
		return ""
	}
	return v.Steps[v.Current+1].Href
}

// figureClass is the wrapper class of the figure at the current step.
func (v walkView) figureClass() string { return v.cur().figureClass() }

// figureClass is the wrapper class of the step's figure.
func (s walkStepView) figureClass() string {
	return strings.TrimSpace("gl-walk-figure " + s.Highlight)
}

// handleWalk serves the walkthrough of the query's plan: one step at a
// time (step=), as a page or in a projector's large type, or every step
// one per printed page (view=print). The server marks the highlight, so
// the steps work as plain links; the page script adds the keys and moves
// between steps without reloading. An empty query opens the startup plan.
func handleWalk(logger *slog.Logger, cfg Config) http.HandlerFunc {
	return func(w http.ResponseWriter, r *http.Request) {
		if r.URL.RawQuery == "" {
			http.Redirect(w, r, "/walk?"+FormOf(cfg.Plan).Query(), http.StatusSeeOther)
			return
		}
		q, f, msgs := readQuery(r)
		st := newState(f, msgs).withFigure(parseFigureForm(q))
		v := buildWalk(st, q)
		var styles []string
		draw := func(prefix string) string {
			svg, err := drawFigure(cfg.Figure, st.res, walkFigureOptions(st, prefix))
			if err != nil {
				logger.LogAttrs(r.Context(), slog.LevelError, "figure", slog.String("id", middleware.GetReqID(r.Context())), slog.Any("err", err))
				v.FigureErr = "The figure could not be drawn: " + err.Error()
				return ""
			}
			inline := inlineSVG(svg)
			styles = append(styles, styleSources(inline)...)
			return inline
		}
		if v.View == viewPrint {
			for i := range v.Steps {
				v.Steps[i].Figure = draw(fmt.Sprintf("s%d-", i+1))
			}
		} else {
			v.Figure = draw("")
		}
		slices.Sort(styles)
		writeHTML(w, r, logger, v.Status, walkPage(v), slices.Compact(styles))
	}
}

// buildWalk makes the walkthrough view of a state; q is the request's
// query, for the step and the layout.
func buildWalk(st state, q url.Values) walkView {
	steps := Walkthrough(st.res)
	base := st.query()
	v := walkView{PlanTitle: strings.TrimSpace(st.plan.Name), Status: st.status()}
	if v.PlanTitle == "" {
		v.PlanTitle = "Untitled plan"
	}
	bad := func(format string, args ...any) {
		v.Notes = append(v.Notes, note{Severity: string(grid.Error), Text: fmt.Sprintf(format, args...)})
		v.Status = http.StatusUnprocessableEntity
	}
	keys := make([]string, len(steps))
	for i, s := range steps {
		keys[i] = s.Key
	}
	switch view := strings.TrimSpace(q.Get(keyView)); strings.ToLower(view) {
	case viewPage, viewProjector, viewPrint:
		v.View = strings.ToLower(view)
	default:
		bad("view: %q is not a layout of the walkthrough; use projector or print, or leave it out for the page.", shortText(view))
	}
	if step := strings.TrimSpace(q.Get(keyStep)); step != "" {
		if n, err := strconv.Atoi(step); err == nil && n >= 1 && n <= len(steps) {
			v.Current = n - 1
		} else if i := slices.Index(keys, step); i >= 0 {
			v.Current = i
		} else {
			bad("step: %q is not a step of this walkthrough; use a number from 1 to %d or one of %s. It opens at the first step.", shortText(step), len(steps), strings.Join(keys, ", "))
		}
	}
	if len(st.inputErr) > 0 || len(st.fig.msgs) > 0 {
		bad("The link holds values that do not parse (%s); the walkthrough shows what the rest of the plan places. Correct them in the planner.",
			strings.Join(append(sortedKeys(st.inputErr), sortedKeys(st.fig.msgs)...), ", "))
	}
	link := func(step, view string) string {
		return "/walk?" + joinQuery(base, keyStep+"="+url.QueryEscape(step), optKey(keyView, view))
	}
	for i, s := range steps {
		v.Steps = append(v.Steps, walkStepView{
			Number: i + 1, Key: s.Key, Title: s.Title, Narration: s.Narration,
			Highlight: highlightClass(s.Highlight), Href: link(s.Key, v.View),
		})
	}
	cur := steps[v.Current].Key
	v.Planner = "/?" + base
	v.Page = link(cur, viewPage)
	v.Projector = link(cur, viewProjector)
	v.Print = "/walk?" + joinQuery(base, optKey(keyView, viewPrint))
	v.Title = fmt.Sprintf("%d/%d %s · %s · gridloom", v.Current+1, len(steps), steps[v.Current].Title, v.PlanTitle)
	if v.View == viewPrint {
		v.Title = "Walkthrough · " + v.PlanTitle + " · gridloom"
	}
	return v
}

// optKey writes k=v, or nothing when v is empty.
func optKey(k, v string) string {
	if v == "" {
		return ""
	}
	return k + "=" + url.QueryEscape(v)
}

// walkFigureOptions are the options of the walkthrough's figures: the
// page's, without the caption (the page names each step), with the ids
// prefixed so that the print layout's figures do not clash.
func walkFigureOptions(st state, prefix string) render.Options {
	opt := st.fig.opt
	opt.Caption, opt.IDPrefix = "", prefix
	return opt
}

package web

import (
	"fmt"
	"net/url"
	"slices"
	"strconv"
	"strings"

	"gridloom/grid"
	"gridloom/render"
	"gridloom/web/planform"
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
		case "channel", "guards", "carriers", "align", "longcp", "tdd", "ssb", "raster", "coreset0", "prach":
			classes = append(classes, "gl-hl-"+t)
		default:
			if s, ok := strings.CutPrefix(t, "part:"); ok {
				if i, ok := planform.Index(s); ok && i < grid.MaxPartitions {
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

// buildWalk makes the walkthrough view of a state; q is the request's
// query, for the step and the layout.
func buildWalk(st planform.State, q url.Values) walkView {
	steps := Walkthrough(st.Result)
	base := st.Query()
	v := walkView{PlanTitle: strings.TrimSpace(st.Plan.Name), Status: statusOf(st.Invalid())}
	if v.PlanTitle == "" {
		v.PlanTitle = "Untitled plan"
	}
	bad := func(format string, args ...any) {
		v.Notes = append(v.Notes, note{Severity: string(grid.Error), Text: fmt.Sprintf(format, args...)})
		v.Status = 422
	}
	keys := make([]string, len(steps))
	for i, s := range steps {
		keys[i] = s.Key
	}
	switch view := strings.TrimSpace(q.Get(keyView)); strings.ToLower(view) {
	case viewPage, viewProjector, viewPrint:
		v.View = strings.ToLower(view)
	default:
		bad("view: %q is not a layout of the walkthrough; use projector or print, or leave it out for the page.", planform.ShortText(view))
	}
	if step := strings.TrimSpace(q.Get(keyStep)); step != "" {
		if n, err := strconv.Atoi(step); err == nil && n >= 1 && n <= len(steps) {
			v.Current = n - 1
		} else if i := slices.Index(keys, step); i >= 0 {
			v.Current = i
		} else {
			bad("step: %q is not a step of this walkthrough; use a number from 1 to %d or one of %s. It opens at the first step.", planform.ShortText(step), len(steps), strings.Join(keys, ", "))
		}
	}
	if len(st.InputErr) > 0 || len(st.Fig.Msgs) > 0 {
		bad("The link holds values that do not parse (%s); the walkthrough shows what the rest of the plan places. Correct them in the planner.",
			strings.Join(append(sortedKeys(st.InputErr), sortedKeys(st.Fig.Msgs)...), ", "))
	}
	link := func(step, view string) string {
		return "/walk?" + planform.JoinQuery(base, keyStep+"="+url.QueryEscape(step), optKey(keyView, view))
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
	v.Print = "/walk?" + planform.JoinQuery(base, optKey(keyView, viewPrint))
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
// prefixed so that the print layout's figures do not clash. The projector
// draws with projectorPreset unless the link names a preset.
func walkFigureOptions(st planform.State, prefix, view string) render.Options {
	opt := st.Fig.Opt
	opt.Caption, opt.IDPrefix = "", prefix
	if view == viewProjector && opt.Preset.Name == "" {
		opt.Preset = projector
	}
	return opt
}

// projector is projectorPreset, made once rather than on each request.
var projector = projectorPreset()

// projectorPreset is the projector's own layout: the slide preset's 12 pt
// on a 16:9 slide's width, with the plot laid out in the narrowest layout
// a preset may take (560 px), 300 px high, and the key in a column beside
// it (render.Preset.KeyBeside), so that the figure is about twice as wide
// as high (988 × 520 layout px for the campus plan), the shape a screen
// leaves over the narration's band below it (static/app.css). Issue 19
// found 5 px text at 1024×768 with the page's 1200 px layout; here the
// figure is shown at least as wide as its layout on such a screen, so its
// 8 px letters stay 8 px.
func projectorPreset() render.Preset {
	p, err := render.ParsePreset("slide")
	if err != nil || p == nil {
		return render.Preset{}
	}
	// The printed width for which 8 px letters at 12 pt give 560 layout px.
	p.PrintedMM = 560 * p.MinPt / render.MinTextPx / (72 / 25.4)
	p.Width = 2 * 560
	p.PlotHeight = 300
	p.KeyBeside = true
	return *p
}

package web

import (
	"fmt"
	"net/url"
	"slices"
	"strconv"
	"strings"
	"unicode/utf8"

	"gridloom/render"
)

// Query keys of the figure's options. They live in their own "fig."
// namespace, beside the plan's keys, so that no plan key can ever be read
// as one and a key that merely sounds like an option (theme, style) does
// nothing.
const (
	keyFigWidth   = "fig.width"
	keyFigTheme   = "fig.theme"
	keyFigLayers  = "fig.layers"
	keyFigCaption = "fig.caption"
)

// figKeys lists the figure keys in query order.
var figKeys = []string{keyFigWidth, keyFigTheme, keyFigLayers, keyFigCaption}

// noCaption, typed as the caption, draws the figure without one.
const noCaption = "-"

// FigureForm is the figure's options as typed, kept as strings so that a
// value that does not parse is shown again beside its control:
//
//	fig.width    width in px, MinWidth to MaxWidth of render; empty is 1200
//	fig.theme    light or print; empty is light
//	fig.layers   the layers shown, comma-separated (lattice, cp, guards,
//	             labels, tdd, ssb), or none; empty shows them all
//	fig.caption  the caption line; empty is the plan's name, "-" none
//
// fig.layers may be repeated: the values are joined, and a value "none"
// beside layer names is dropped. The form's layer checkboxes use this: a
// hidden "none" is sent first, then every layer checked, so that
// unchecking them all is heard rather than read as "all".
type FigureForm struct {
	Width, Theme, Layers, Caption string
}

// parseFigureForm reads the figure keys of a query.
func parseFigureForm(v url.Values) FigureForm {
	return FigureForm{
		Width:   v.Get(keyFigWidth),
		Theme:   v.Get(keyFigTheme),
		Layers:  layersValue(v[keyFigLayers]),
		Caption: v.Get(keyFigCaption),
	}
}

// layersValue joins the values of fig.layers into one list, as its doc
// comment on FigureForm says; a list that names every layer and nothing
// else is written as "", the default.
func layersValue(vals []string) string {
	var items []string
	for _, v := range vals {
		for item := range strings.SplitSeq(v, ",") {
			if item = strings.TrimSpace(item); item != "" {
				items = append(items, item)
			}
		}
	}
	named := slices.DeleteFunc(slices.Clone(items), func(s string) bool { return strings.EqualFold(s, "none") })
	switch {
	case len(items) == 0:
		return ""
	case len(named) == 0:
		return "none"
	}
	text := strings.Join(named, ",")
	if ls, err := render.ParseLayers(text); err == nil {
		if ls == (render.Layers{}) {
			return ""
		}
		return ls.String()
	}
	return text
}

// query writes the figure keys that have a value, in a fixed order.
func (ff FigureForm) query() string {
	v := []string{ff.Width, ff.Theme, ff.Layers, ff.Caption}
	var parts []string
	for i, k := range figKeys {
		if v[i] != "" {
			parts = append(parts, k+"="+url.QueryEscape(v[i]))
		}
	}
	return strings.Join(parts, "&")
}

// figureState is a FigureForm with what it means for the renderer.
type figureState struct {
	form FigureForm
	opt  render.Options // width, theme, layers and caption
	msgs Messages       // by query key
}

// newFigureState reads ff; planName is the caption when ff gives none.
func newFigureState(ff FigureForm, planName string) figureState {
	st := figureState{form: ff, msgs: Messages{}}
	if t := strings.TrimSpace(ff.Width); t != "" {
		n, err := strconv.Atoi(t)
		switch {
		case err != nil:
			st.msgs.add(keyFigWidth, "Figure width (fig.width): %q is not a whole number; give a width in px from %d to %d, or nothing for %d.", ff.Width, render.MinWidth, render.MaxWidth, render.DefaultWidth)
		case n < render.MinWidth || n > render.MaxWidth:
			st.msgs.add(keyFigWidth, "Figure width (fig.width): %d px is outside %d to %d px; give a width in that range, or nothing for %d.", n, render.MinWidth, render.MaxWidth, render.DefaultWidth)
		default:
			st.opt.Width = n
		}
	}
	if th, err := render.ParseTheme(ff.Theme); err != nil {
		st.msgs.add(keyFigTheme, "Figure theme (fig.theme): %q is not a theme; use light or print.", shortText(ff.Theme))
	} else {
		st.opt.Theme = th
	}
	if ls, err := render.ParseLayers(ff.Layers); err != nil {
		st.msgs.add(keyFigLayers, "Figure layers (fig.layers): %s", strings.TrimPrefix(err.Error(), "layers: "))
	} else {
		st.opt.Layers = ls
	}
	switch c := strings.TrimSpace(ff.Caption); {
	case c == noCaption:
	case c == "":
		st.opt.Caption = truncate(strings.TrimSpace(planName), render.MaxCaption)
	case utf8.RuneCountInString(ff.Caption) > render.MaxCaption:
		st.msgs.add(keyFigCaption, "Caption (fig.caption): the caption has %d characters; give at most %d, nothing for the plan's name, or - for none.", utf8.RuneCountInString(ff.Caption), render.MaxCaption)
	default:
		st.opt.Caption = ff.Caption
	}
	return st
}

func shortText(s string) string { return truncate(s, 40) }

// figureView is the form's box of figure options.
type figureView struct {
	Group   group
	Open    bool
	Width   control
	Theme   control
	Caption control
	// Layers is one checkbox per layer, or, when the typed list does not
	// parse, LayersText: a text input holding it as typed, so nothing is
	// lost and the user can correct it.
	Layers     []checkbox
	LayersText *control
	Hint       string
	// ShowCaption is false where the page draws its own captions (the
	// comparison): the caption then rides along unseen, so a round trip
	// through that page keeps it.
	ShowCaption bool
}

type checkbox struct {
	ID, Name, Value, Label string
	Checked                bool
}

const idFigure = "g-fig"

// buildFigureView makes the figure box of st. planName is the caption's
// placeholder.
func buildFigureView(st figureState, planName string) figureView {
	ff := st.form
	note := func(key string) []note {
		if m, ok := st.msgs[key]; ok {
			return []note{{Severity: "error", Text: m}}
		}
		return nil
	}
	text := func(key, label, value, mode, placeholder, size string) control {
		return control{ID: controlIDOfKey(key), Name: key, Label: label, Value: value, InputMode: mode,
			Placeholder: placeholder, Size: size, Notes: note(key)}
	}
	capHolder := strings.TrimSpace(planName)
	if capHolder == "" {
		capHolder = "none (the plan has no name)"
	}
	fv := figureView{
		Group:   group{ID: idFigure},
		Width:   text(keyFigWidth, "Width (px)", ff.Width, "numeric", strconv.Itoa(render.DefaultWidth), "4"),
		Theme:   text(keyFigTheme, "Theme", ff.Theme, "", "", "4"),
		Caption: text(keyFigCaption, "Caption", ff.Caption, "", capHolder, "12"),
		Hint: "These options shape the figure on the page, the SVG and PNG downloads, the walkthrough and the comparison. " +
			"An empty caption is the plan's name; a single - draws none.",
		ShowCaption: true,
	}
	fv.Theme.Options = pick([]option{{Value: "light", Label: "light (screen)"}, {Value: "print", Label: "print (black and white)"}},
		orDefault(strings.ToLower(strings.TrimSpace(ff.Theme)), "light"), func(string) string { return "not a theme" })
	if _, bad := st.msgs[keyFigLayers]; bad {
		c := text(keyFigLayers, "Layers shown", ff.Layers, "", "all", "12")
		fv.LayersText = &c
	} else {
		for i, name := range render.LayerNames() {
			fv.Layers = append(fv.Layers, checkbox{ID: controlIDOfKey(keyFigLayers) + "-" + name, Name: keyFigLayers, Value: name,
				Label: layerLabels[i], Checked: st.opt.Layers.Shows(render.Layer(1 << i))})
		}
	}
	fv.Open = ff != FigureForm{} || len(st.msgs) > 0
	return fv
}

// summary is the box's closed line: what it holds, or what is set.
func (fv figureView) summary() string {
	var set []string
	if fv.Width.Value != "" {
		set = append(set, fv.Width.Value+" px")
	}
	if v := strings.TrimSpace(fv.Theme.Value); v != "" {
		set = append(set, v+" theme")
	}
	if fv.LayersText != nil {
		set = append(set, "layers "+fv.LayersText.Value)
	} else if n := len(fv.Layers) - countChecked(fv.Layers); n > 0 {
		set = append(set, plural(n, "layer", "layers")+" hidden")
	}
	if fv.ShowCaption && fv.Caption.Value != "" {
		set = append(set, "own caption")
	}
	if len(set) == 0 {
		if fv.ShowCaption {
			return "width, theme, layers, caption"
		}
		return "width, theme, layers"
	}
	return strings.Join(set, ", ")
}

func countChecked(cs []checkbox) int {
	n := 0
	for _, c := range cs {
		if c.Checked {
			n++
		}
	}
	return n
}

// layerLabels names the layers of render.LayerNames for the checkboxes.
var layerLabels = []string{"lattice lines", "cyclic prefixes", "guardbands", "labels", "TDD directions", "SS/PBCH blocks"}

// findings lists the figure's messages as findings of the page, each
// linked to its control.
func (st figureState) findings() []findingView {
	var out []findingView
	for _, k := range figKeys {
		if m, ok := st.msgs[k]; ok {
			out = append(out, findingView{Severity: "error", Code: "input", Text: m, Control: controlIDOfKey(k), ControlLabel: "figure " + strings.TrimPrefix(k, "fig.")})
		}
	}
	return out
}

// joinQuery joins query strings, leaving out the empty ones.
func joinQuery(qs ...string) string {
	var parts []string
	for _, q := range qs {
		if q != "" {
			parts = append(parts, q)
		}
	}
	return strings.Join(parts, "&")
}

// describe says what options a download is drawn with, for the links'
// titles.
func (st figureState) describe() string {
	w := st.opt.Width
	if w == 0 {
		w = render.DefaultWidth
	}
	return fmt.Sprintf("%d px, %s theme, layers %s", w, st.opt.Theme, st.opt.Layers)
}

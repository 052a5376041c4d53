package planform

import (
	"math"
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
	KeyFigWidth   = "fig.width"
	KeyFigTheme   = "fig.theme"
	KeyFigLayers  = "fig.layers"
	KeyFigCaption = "fig.caption"
	// The keys for paper and rooms (issue 19).
	KeyFigPreset   = "fig.preset"
	KeyFigTimeUnit = "fig.timeUnit"
	KeyFigScale    = "fig.scale"
	KeyFigDPI      = "fig.dpi"
)

// FigKeys lists the figure keys in query order.
var FigKeys = []string{KeyFigWidth, KeyFigTheme, KeyFigLayers, KeyFigCaption, KeyFigPreset, KeyFigTimeUnit, KeyFigScale, KeyFigDPI}

// noCaption, typed as the caption, draws the figure without one.
const noCaption = "-"

// FigureForm is the figure's options as typed, kept as strings so that a
// value that does not parse is shown again beside its control:
//
//	fig.width    width in px, MinWidth to MaxWidth of render; empty is 1200
//	fig.theme    light or print; empty is light
//	fig.layers   the layers shown, comma-separated (lattice, cp, guards,
//	             labels, tdd, ssb, raster, coreset0, prach, overlap), or
//	             none; empty shows them all
//	fig.caption  the caption line; empty is the plan's name, "-" none
//	fig.preset   a4, slide or poster: the layout for a printed width with
//	             a least type size (render.Preset); empty or none is none
//	fig.timeUnit the time axis's unit, auto, us or ms; empty is auto
//	fig.scale    the PNG's pixels per figure px, 1 to render.MaxPNGScale;
//	             empty is 1
//	fig.dpi      the PNG's resolution in its pHYs chunk, render.MinDPI to
//	             render.MaxDPI; with a preset and no width it sets the
//	             width too; empty is none
//
// fig.layers may be repeated: the values are joined, and a value "none"
// beside layer names is dropped. The form's layer checkboxes use this: a
// hidden "none" is sent first, then every layer checked, so that
// unchecking them all is heard rather than read as "all".
type FigureForm struct {
	Width, Theme, Layers, Caption string
	Preset, TimeUnit, Scale, DPI  string
}

// ParseFigureForm reads the figure keys of a query.
func ParseFigureForm(v url.Values) FigureForm {
	return FigureForm{
		Width:   v.Get(KeyFigWidth),
		Theme:   v.Get(KeyFigTheme),
		Layers:  layersValue(v[KeyFigLayers]),
		Caption: v.Get(KeyFigCaption),

		Preset:   v.Get(KeyFigPreset),
		TimeUnit: v.Get(KeyFigTimeUnit),
		Scale:    v.Get(KeyFigScale),
		DPI:      v.Get(KeyFigDPI),
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

// Query writes the figure keys that have a value, in a fixed order.
func (ff FigureForm) Query() string {
	v := []string{ff.Width, ff.Theme, ff.Layers, ff.Caption, ff.Preset, ff.TimeUnit, ff.Scale, ff.DPI}
	var parts []string
	for i, k := range FigKeys {
		if v[i] != "" {
			parts = append(parts, k+"="+url.QueryEscape(v[i]))
		}
	}
	return strings.Join(parts, "&")
}

// FigureState is a FigureForm with what it means for the renderer.
type FigureState struct {
	Form FigureForm
	Opt  render.Options // width, theme, layers, caption, preset, time unit, PNG scale and dpi
	Msgs Messages       // by query key
}

// NewFigureState reads ff; planName is the caption when ff gives none.
func NewFigureState(ff FigureForm, planName string) FigureState {
	st := FigureState{Form: ff, Msgs: Messages{}}
	if t := strings.TrimSpace(ff.Width); t != "" {
		n, err := strconv.Atoi(t)
		switch {
		case err != nil:
			st.Msgs.Add(KeyFigWidth, "Figure width (fig.width): %q is not a whole number; give a width in px from %d to %d, or nothing for %d.", ff.Width, render.MinWidth, render.MaxWidth, render.DefaultWidth)
		case n < render.MinWidth || n > render.MaxWidth:
			st.Msgs.Add(KeyFigWidth, "Figure width (fig.width): %d px is outside %d to %d px; give a width in that range, or nothing for %d.", n, render.MinWidth, render.MaxWidth, render.DefaultWidth)
		default:
			st.Opt.Width = n
		}
	}
	if th, err := render.ParseTheme(ff.Theme); err != nil {
		st.Msgs.Add(KeyFigTheme, "Figure theme (fig.theme): %q is not a theme; use light or print.", ShortText(ff.Theme))
	} else {
		st.Opt.Theme = th
	}
	if ls, err := render.ParseLayers(ff.Layers); err != nil {
		st.Msgs.Add(KeyFigLayers, "Figure layers (fig.layers): %q is not a figure layer; list the layers to show from %s, separated by commas, or give all or none.",
			ShortText(badLayer(ff.Layers)), joinAnd(render.LayerNames()))
	} else {
		st.Opt.Layers = ls
	}
	switch c := strings.TrimSpace(ff.Caption); {
	case c == noCaption:
	case c == "":
		st.Opt.Caption = Truncate(strings.TrimSpace(planName), render.MaxCaption)
	case utf8.RuneCountInString(ff.Caption) > render.MaxCaption:
		st.Msgs.Add(KeyFigCaption, "Caption (fig.caption): the caption has %d characters; give at most %d, nothing for the plan's name, or - for none.", utf8.RuneCountInString(ff.Caption), render.MaxCaption)
	default:
		st.Opt.Caption = ff.Caption
	}
	if p, err := render.ParsePreset(ff.Preset); err != nil {
		st.Msgs.Add(KeyFigPreset, "Preset (fig.preset): %q is not a preset; use %s, or none.", ShortText(ff.Preset), joinAnd(render.PresetNames()))
	} else if p != nil {
		st.Opt.Preset = *p
	}
	if u, err := render.ParseTimeUnit(ff.TimeUnit); err != nil {
		st.Msgs.Add(KeyFigTimeUnit, "Time unit (fig.timeUnit): %q is not a unit of the time axis; use auto, us or ms.", ShortText(ff.TimeUnit))
	} else {
		st.Opt.TimeUnit = u
	}
	if n, ok := st.whole(KeyFigScale, "PNG scale (fig.scale)", ff.Scale, 1, render.MaxPNGScale, "1"); ok {
		st.Opt.PNGScale = n
	}
	if n, ok := st.whole(KeyFigDPI, "PNG resolution (fig.dpi)", ff.DPI, render.MinDPI, render.MaxDPI, "none"); ok {
		st.Opt.DPI = n
	}
	if st.Opt.Preset.Name != "" && st.Opt.Width == 0 && st.Opt.DPI != 0 {
		// The preset's printed width at the dpi must be a width render draws.
		if px := int(math.Round(st.Opt.Preset.PrintedMM / 25.4 * float64(st.Opt.DPI))); px > render.MaxWidth || px < render.MinWidth {
			most := int(float64(render.MaxWidth) / (st.Opt.Preset.PrintedMM / 25.4))
			st.Msgs.Add(KeyFigDPI, "PNG resolution (fig.dpi): at %d dpi the %s preset's %g mm are %d px, outside %d to %d px; give %d to %d dpi, or a width.",
				st.Opt.DPI, st.Opt.Preset.Name, st.Opt.Preset.PrintedMM, px, render.MinWidth, render.MaxWidth, max(render.MinDPI, int(math.Ceil(float64(render.MinWidth)/(st.Opt.Preset.PrintedMM/25.4)))), most)
			st.Opt.DPI = 0
		}
	}
	return st
}

// whole reads a whole number from lo to hi typed for key, adding a message
// naming the field when it is not one; empty is not ok and no message.
func (st *FigureState) whole(key, field, typed string, lo, hi int, empty string) (int, bool) {
	t := strings.TrimSpace(typed)
	if t == "" {
		return 0, false
	}
	n, err := strconv.Atoi(t)
	switch {
	case err != nil:
		st.Msgs.Add(key, "%s: %q is not a whole number; give %d to %d, or nothing for %s.", field, ShortText(typed), lo, hi, empty)
	case n < lo || n > hi:
		st.Msgs.Add(key, "%s: %d is outside %d to %d; give a number in that range, or nothing for %s.", field, n, lo, hi, empty)
	default:
		return n, true
	}
	return 0, false
}

// badLayer is the first item of a layer list that names no layer.
func badLayer(list string) string {
	for item := range strings.SplitSeq(list, ",") {
		if _, err := render.ParseLayers(item); err != nil {
			return strings.TrimSpace(item)
		}
	}
	return list
}

// joinAnd lists words as a sentence does: "a, b and c".
func joinAnd(words []string) string {
	if len(words) < 2 {
		return strings.Join(words, "")
	}
	return strings.Join(words[:len(words)-1], ", ") + " and " + words[len(words)-1]
}

// ShortText cuts a value quoted back in a message to 40 characters.
func ShortText(s string) string { return Truncate(s, 40) }

// Truncate cuts s to n characters.
func Truncate(s string, n int) string {
	if utf8.RuneCountInString(s) <= n {
		return s
	}
	return string([]rune(s)[:n])
}

// JoinQuery joins query strings, leaving out the empty ones.
func JoinQuery(qs ...string) string {
	var parts []string
	for _, q := range qs {
		if q != "" {
			parts = append(parts, q)
		}
	}
	return strings.Join(parts, "&")
}

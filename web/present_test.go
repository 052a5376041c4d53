package web

import (
	"bytes"
	"fmt"
	"image/png"
	"net/http"
	"net/url"
	"os"
	"reflect"
	"regexp"
	"strings"
	"testing"

	"gridloom/grid"
	"gridloom/grid/planfile"
	"gridloom/render"
	"gridloom/static"
	"gridloom/web/planform"
)

// Tests of the walkthrough, the comparison and the figure options.

func loadPlanFile(t *testing.T, path string) grid.Plan {
	t.Helper()
	data, err := os.ReadFile(path)
	if err != nil {
		t.Fatal(err)
	}
	p, err := planfile.Decode(data)
	if err != nil {
		t.Fatalf("%s: %v", path, err)
	}
	return p
}

// checkPageMarkup is checkMarkup for a page that inlines svgs figures
// (the walkthrough's print layout, the comparison): every other rule holds.
func checkPageMarkup(t *testing.T, what, body string, scripts, svgs int) {
	t.Helper()
	allowed := fmt.Sprintf("%d svg elements, want the figure only", svgs)
	if got := strings.Count(body, "<svg "); got != svgs {
		t.Errorf("%s: %d svg elements, want %d", what, got, svgs)
	}
	for _, p := range markupProblems(body, scripts) {
		if p != allowed {
			t.Errorf("%s: %s", what, p)
		}
	}
}

// ids lists the id attributes of a page, and the ones that repeat.
func ids(body string) (all map[string]int, dup []string) {
	all = map[string]int{}
	for _, tag := range startTags(body) {
		if id, ok := tag.attrs["id"]; ok {
			all[id]++
			if all[id] == 2 {
				dup = append(dup, id)
			}
		}
	}
	return all, dup
}

// attrOf returns the value of attribute name in the first start tag that
// matches sel (a regexp over the tag's text).
func attrOf(t *testing.T, body, sel, name string) string {
	t.Helper()
	tag := regexp.MustCompile(`<[a-z]+[^>]*` + sel + `[^>]*>`).FindString(body)
	if tag == "" {
		t.Fatalf("no tag matching %s", sel)
	}
	m := regexp.MustCompile(`\s` + regexp.QuoteMeta(name) + `="([^"]*)"`).FindStringSubmatch(tag)
	if m == nil {
		return ""
	}
	return m[1]
}

func TestHighlightClass(t *testing.T) {
	for _, c := range []struct {
		targets []string
		want    string
	}{
		{nil, ""},
		{[]string{"channel", "guards"}, "gl-hl gl-hl-channel gl-hl-guards"},
		{[]string{"part:0", "part:15"}, "gl-hl gl-hl-part-0 gl-hl-part-15"},
		{[]string{"align", "longcp", "tdd", "ssb", "carriers"}, "gl-hl gl-hl-align gl-hl-longcp gl-hl-tdd gl-hl-ssb gl-hl-carriers"},
		// Nothing else becomes a class: not a partition out of range, not text.
		{[]string{"part:16", "part:01", `x" onload="y`, "gl-hl-tdd"}, ""},
	} {
		if got := highlightClass(c.targets); got != c.want {
			t.Errorf("highlightClass(%q) = %q, want %q", c.targets, got, c.want)
		}
	}
}

// TestHighlightsHaveStyles: every target a walkthrough of the demo plans
// highlights maps to a class, and app.css has a rule that keeps that class's
// parts of the figure at full strength; every partition index of a plan
// has one.
func TestHighlightsHaveStyles(t *testing.T) {
	css, err := static.FS.ReadFile("app.css")
	if err != nil {
		t.Fatal(err)
	}
	has := func(class string) bool { return bytes.Contains(css, []byte("."+class+" ")) }
	seen := map[string]bool{}
	for name, p := range demoPlans(t) {
		for _, s := range Walkthrough(grid.Compute(p)) {
			cls := highlightClass(s.Highlight)
			if len(s.Highlight) > 0 && cls == "" {
				t.Errorf("%s step %s: targets %q map to no class", name, s.Key, s.Highlight)
			}
			for _, c := range strings.Fields(cls) {
				seen[c] = true
			}
		}
	}
	for i := range grid.MaxPartitions {
		seen[fmt.Sprintf("gl-hl-part-%d", i)] = true
	}
	for c := range seen {
		if !has(c) {
			t.Errorf("app.css has no rule for .%s", c)
		}
	}
	if len(seen) < 8 {
		t.Errorf("only %d highlight classes seen: %v", len(seen), seen)
	}
}

func TestWalkPage(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	steps := Walkthrough(grid.Compute(testConfig(t).Plan))

	r := get(t, srv, "/walk")
	wantStatus(t, r, http.StatusSeeOther)
	if loc := r.Header.Get("Location"); loc != "/walk?"+q {
		t.Errorf("GET /walk: Location %q, want the startup plan's walkthrough", loc)
	}

	r = get(t, srv, "/walk?"+q)
	wantStatus(t, r, http.StatusOK)
	checkPageMarkup(t, "walk", r.body, 1, 1)
	if n := strings.Count(r.body, `data-testid="walk-step"`); n != len(steps) {
		t.Errorf("%d step sections, want %d", n, len(steps))
	}
	if n := len(regexp.MustCompile(`<section class="gl-step"[^>]* hidden[ >]`).FindAllString(r.body, -1)); n != len(steps)-1 {
		t.Errorf("%d hidden steps, want all but the first (%d)", n, len(steps)-1)
	}
	if cls := attrOf(t, r.body, `id="gl-walk-figure"`, "class"); cls != "gl-walk-figure gl-hl gl-hl-channel gl-hl-guards" {
		t.Errorf("first step's figure class %q", cls)
	}
	if href := attrOf(t, r.body, `id="gl-walk-prev"`, "href"); href != "" {
		t.Errorf("the first step links to a previous one: %q", href)
	}
	next := "/walk?" + q + "&step=grids"
	wantContains(t, "walk", r.body,
		`href="`+strings.ReplaceAll(next, "&", "&amp;")+`" data-testid="walk-next"`,
		`href="/?`+strings.ReplaceAll(q, "&", "&amp;")+`" data-testid="walk-planner"`,
		"Step 1 of 12", "The channel and its guardbands", "552.5 kHz", // narration from the plan's numbers
		`id="gl-plot"`,
	)
	if strings.Contains(r.body, "gl-caption") {
		t.Error("the walkthrough's figure has a caption; the page names each step")
	}

	// A step by number or by key, and its highlight.
	for _, step := range []string{"4", "part-1"} {
		r = get(t, srv, "/walk?"+q+"&step="+step)
		wantStatus(t, r, http.StatusOK)
		if cls := attrOf(t, r.body, `id="gl-walk-figure"`, "class"); cls != "gl-walk-figure gl-hl gl-hl-part-1" {
			t.Errorf("step=%s: figure class %q, want the second partition highlighted", step, cls)
		}
		wantContains(t, "step "+step, r.body, "Step 4 of 12", `<section class="gl-step" id="step-part-1" data-step="3"`, `aria-current="step">Partition video</a>`)
		if regexp.MustCompile(`<section class="gl-step" id="step-part-1"[^>]* hidden[ >]`).MatchString(r.body) {
			t.Errorf("step=%s: the step shown is hidden", step)
		}
	}
	r = get(t, srv, "/walk?"+q+"&step=findings")
	if href := attrOf(t, r.body, `id="gl-walk-next"`, "href"); href != "" {
		t.Errorf("the last step links to a next one: %q", href)
	}

	// The projector layout keeps the step.
	r = get(t, srv, "/walk?"+q+"&step=tdd&view=projector")
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "projector", r.body, `<body class="gl-walking gl-projector">`, "Page layout", "Step 7 of 12")
	if href := attrOf(t, r.body, `data-testid="walk-layout"`, "href"); !strings.HasSuffix(href, "step=tdd") {
		t.Errorf("the page-layout link %q does not keep the step", href)
	}

	// Refusals: the parameter, what it allows, and the walkthrough still shown.
	for _, c := range []struct{ query, param, allowed string }{
		{"&step=99", "step", "1 to 12"},
		{"&step=warp", "step", "channel, grids, part-0"},
		{"&view=cinema", "view", "projector or print"},
		{"&fig.theme=sepia", "fig.theme", "The link holds values that do not parse"},
		{"p1.size=lots", "partitions[1].sizePrb", "Correct them in the planner"},
	} {
		query := q + c.query
		if !strings.HasPrefix(c.query, "&") {
			query = strings.Replace(q, "p1.size=50", c.query, 1)
		}
		r = get(t, srv, "/walk?"+query)
		wantStatus(t, r, http.StatusUnprocessableEntity)
		wantContains(t, c.query, r.body, `data-testid="walk-notes"`, c.param, c.allowed, "Step 1 of ")
	}
}

func TestWalkPrintAll(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := campusQuery(t)
	steps := Walkthrough(grid.Compute(testConfig(t).Plan))
	r := get(t, srv, "/walk?"+q+"&view=print&fig.theme=print")
	wantStatus(t, r, http.StatusOK)
	checkPageMarkup(t, "print all", r.body, 1, len(steps))
	all, dup := ids(r.body)
	if len(dup) > 0 {
		t.Errorf("ids repeat on the page: %v", dup)
	}
	for i, s := range steps {
		if all[fmt.Sprintf("s%d-gl-plot", i+1)] != 1 {
			t.Errorf("step %d has no figure of its own", i+1)
		}
		cls := highlightClass(s.Highlight)
		want := `<h2 id="h-step-` + s.Key + `">` + s.Title + `</h2><div class="` + strings.TrimSpace("gl-walk-figure "+cls) + `">`
		if !strings.Contains(r.body, want) {
			t.Errorf("step %s: no figure with its highlight %q", s.Key, cls)
		}
	}
	// The print theme reaches the figures.
	wantContains(t, "print all", r.body, `url(#s1-gl-guard)`, `data-testid="walk-print-all"`)
}

func TestNamesAreTextInTheWalkthrough(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	q := planform.FormOf(hostilePlan(t)).Query()
	r := get(t, srv, "/walk?"+q+"&step=part-0")
	wantStatus(t, r, http.StatusOK)
	checkPageMarkup(t, "hostile walk", r.body, 1, 1)
	wantContains(t, "hostile walk", r.body, "Partition "+`&lt;img src=x onerror=alert(1)&gt;`)
	r = get(t, srv, "/walk?"+q+"&view=print")
	wantStatus(t, r, http.StatusOK)
	checkPageMarkup(t, "hostile print all", r.body, 1, len(Walkthrough(grid.Compute(hostilePlan(t)))))
}

func TestFigureOptionsLayers(t *testing.T) {
	for _, c := range []struct {
		query, want string
	}{
		{"", ""},
		{"fig.layers=none", "none"}, // every box unchecked
		{"fig.layers=none&fig.layers=lattice&fig.layers=tdd", "lattice,tdd"}, // two checked
		{"fig.layers=none&fig.layers=lattice&fig.layers=cp&fig.layers=guards&fig.layers=labels&fig.layers=tdd&fig.layers=ssb&fig.layers=raster&fig.layers=coreset0&fig.layers=prach&fig.layers=overlap", ""},
		{"fig.layers=ssb,+TDD", "tdd,ssb"},
		{"fig.layers=all", ""},
		{"fig.layers=lattice,grid", "lattice,grid"}, // kept as typed, for its message
	} {
		if got := planform.ParseFigureForm(mustQuery(t, c.query)).Layers; got != c.want {
			t.Errorf("%q: layers %q, want %q", c.query, got, c.want)
		}
	}
}

// TestFigureOptions: the figure and its PNG follow the fig. keys, exactly
// as render draws them; values render cannot take are refused naming the
// key and what it allows.
func TestFigureOptions(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	plan := testConfig(t).Plan
	res := grid.Compute(plan)
	q := campusQuery(t)
	planJSON, err := planfile.EncodeJSON(plan)
	if err != nil {
		t.Fatal(err)
	}
	draw := func(f func(w *bytes.Buffer) error) string {
		var b bytes.Buffer
		if err := f(&b); err != nil {
			t.Fatal(err)
		}
		return b.String()
	}
	layers, _ := render.ParseLayers("lattice,tdd")
	for _, c := range []struct {
		query string
		opt   render.Options
	}{
		{"", render.Options{Caption: plan.Name}},
		{"&fig.caption=-", render.Options{}},
		{"&fig.width=800&fig.theme=print&fig.layers=lattice,tdd&fig.caption=Figure+3.+The+campus+plan", render.Options{Width: 800, Theme: render.ThemePrint, Layers: layers, Caption: "Figure 3. The campus plan"}},
	} {
		r := get(t, srv, "/figure.svg?"+q+c.query)
		wantStatus(t, r, http.StatusOK)
		opt := c.opt
		opt.Plan = planJSON
		if want := draw(func(w *bytes.Buffer) error { return render.Figure(w, res, opt) }); r.body != want {
			t.Errorf("/figure.svg%s differs from render.Figure with %+v", c.query, c.opt)
		}
		p := get(t, srv, "/figure.png?"+q+c.query+"&download=1")
		wantStatus(t, p, http.StatusOK)
		if ct := p.Header.Get("Content-Type"); ct != "image/png" {
			t.Errorf("PNG Content-Type %q", ct)
		}
		wantDisposition(t, p, "hillcrest-campus-40-mhz.png")
		if want := draw(func(w *bytes.Buffer) error { return render.FigurePNG(w, res, c.opt) }); p.body != want {
			t.Errorf("/figure.png%s differs from render.FigurePNG with %+v", c.query, c.opt)
		}
		if _, err := png.Decode(strings.NewReader(p.body)); err != nil {
			t.Errorf("/figure.png%s: %v", c.query, err)
		}
	}

	for _, c := range []struct{ query, key, allowed string }{
		{"&fig.width=99999", "fig.width", "640 to 4800"},
		{"&fig.width=wide", "fig.width", "640 to 4800"},
		{"&fig.theme=sepia", "fig.theme", "light or print"},
		{"&fig.layers=lattice,grid", "fig.layers", "lattice, cp, guards, labels, tdd, ssb, raster, coreset0, prach and overlap"},
		{"&fig.caption=" + strings.Repeat("x", render.MaxCaption+1), "fig.caption", "at most 300"},
	} {
		for _, path := range []string{"/figure.svg?", "/figure.png?"} {
			r := get(t, srv, path+q+c.query)
			wantStatus(t, r, http.StatusUnprocessableEntity)
			wantContains(t, path+c.query, r.body, c.key+": ", c.allowed)
		}
		// The page keeps the input beside its control and says why.
		r := get(t, srv, "/?"+q+c.query)
		wantStatus(t, r, http.StatusUnprocessableEntity)
		id := planform.KeyID(c.key)
		wantContains(t, "the note beside "+id, noteText(t, r.body, id), c.allowed)
		u, _ := url.ParseQuery(strings.TrimPrefix(c.query, "&"))
		if c.key != "fig.theme" {
			if got := inputValue(t, r.body, id); got != u.Get(c.key) {
				t.Errorf("%s shows %q, want the input as typed %q", id, got, u.Get(c.key))
			}
		} else {
			wantContains(t, "theme select", r.body, `<option value="sepia" selected>sepia (not a theme)</option>`)
		}
		// Plan files do not depend on the figure, so they are still served.
		wantStatus(t, get(t, srv, "/plan.json?"+q+c.query), http.StatusOK)
	}

	// The page links every view and download with its figure options.
	r := get(t, srv, "/?"+q+"&fig.theme=print")
	wantStatus(t, r, http.StatusOK)
	esc := strings.ReplaceAll(q, "&", "&amp;") + "&amp;fig.theme=print"
	wantContains(t, "page links", r.body,
		`href="/figure.svg?`+esc+`&amp;download=1"`, `href="/figure.png?`+esc+`&amp;download=1"`,
		`href="/walk?`+esc+`"`, `data-testid="open-compare"`, `data-query="`+esc+`"`,
		`<option value="print" selected>`, `name="fig.layers" value="none"`)
}

// TestFigureRoundTrip: a saved figure opens again as its plan, exactly, and
// the figure of the reopened plan is the figure that was saved.
func TestFigureRoundTrip(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	plans := []grid.Plan{hostilePlan(t), loadPlanFile(t, "../testdata/compare/two-numerologies.yaml")}
	for _, d := range testConfig(t).Demos {
		plans = append(plans, d.Plan)
	}
	for _, plan := range plans {
		fig := "fig.theme=print&fig.layers=lattice%2Clabels%2Ctdd&fig.caption=Figure+1"
		q := planform.JoinQuery(planform.FormOf(plan).Query(), fig)
		first := get(t, srv, "/figure.svg?"+q+"&download=1")
		wantStatus(t, first, http.StatusOK)

		// The plan inside is the plan.
		inner, err := render.PlanFromSVG([]byte(first.body))
		if err != nil {
			t.Fatalf("%s: %v", plan.Name, err)
		}
		back, err := planfile.Decode(inner)
		if err != nil || !reflect.DeepEqual(back, plan) {
			t.Fatalf("%s: the figure's plan reads back as %+v (%v), want %+v", plan.Name, back, err, plan)
		}

		// Opening the figure from the page keeps the page's figure options.
		body, ctype := multipartBody(t, "plan", "figure.svg", []byte(first.body))
		up := post(t, srv, "/open?"+q, ctype, body)
		wantStatus(t, up, http.StatusSeeOther)
		loc := up.Header.Get("Location")
		if loc != "/?"+q {
			t.Errorf("%s: opening its figure goes to %s, want /?%s", plan.Name, loc, q)
		}
		second := get(t, srv, strings.Replace(loc, "/?", "/figure.svg?", 1)+"&download=1")
		if second.body != first.body {
			t.Errorf("%s: the reopened plan's figure differs from the saved one", plan.Name)
		}
	}

	// A figure without a plan, or not a figure at all, is refused beside the
	// file control, on the page the user came from.
	q := campusQuery(t)
	for _, c := range []struct{ file, content, want string }{
		{"drawing.svg", `<svg xmlns="http://www.w3.org/2000/svg"><rect/></svg>`, "carries no gridloom plan"},
		{"broken.svg", `<svg xmlns="http://www.w3.org/2000/svg"><metadata><gl:plan xmlns:gl="urn:x-gridloom:plan:1">!!</gl:plan></metadata></svg>`, "damaged"},
		{"page.html", `<html><body>no</body></html>`, "not an SVG figure"},
	} {
		body, ctype := multipartBody(t, "plan", c.file, []byte(c.content))
		r := post(t, srv, "/open?"+q, ctype, body)
		wantStatus(t, r, http.StatusBadRequest)
		wantContains(t, c.file, noteText(t, r.body, "f-file"), c.file, c.want)
		wantContains(t, c.file, r.body, `value="Hillcrest campus 40 MHz"`)
	}
	// A figure under another name is recognised by its content.
	plan := testConfig(t).Plan
	svg := get(t, srv, "/figure.svg?"+campusQuery(t))
	body, ctype := multipartBody(t, "plan", "no-extension", []byte(svg.body))
	if r := post(t, srv, "/open", ctype, body); r.StatusCode != http.StatusSeeOther || r.Header.Get("Location") != "/?"+planform.FormOf(plan).Query() {
		t.Errorf("a figure without an extension: %d %s", r.StatusCode, r.Header.Get("Location"))
	}
}

func comparePlans(t *testing.T) (a, b grid.Plan) {
	return loadPlanFile(t, "../testdata/compare/one-numerology.yaml"), loadPlanFile(t, "../testdata/compare/two-numerologies.yaml")
}

// plotAttrs reads the data attributes of the plot group with the id.
func plotAttrs(t *testing.T, body, id string) map[string]string {
	t.Helper()
	tag := regexp.MustCompile(`<g id="` + regexp.QuoteMeta(id) + `"[^>]*>`).FindString(body)
	if tag == "" {
		t.Fatalf("no plot group %s", id)
	}
	out := map[string]string{}
	for _, m := range regexp.MustCompile(`(data-[a-z-]+)="([^"]*)"`).FindAllStringSubmatch(tag, -1) {
		out[m[1]] = m[2]
	}
	return out
}

func TestComparePage(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	pa, pb := comparePlans(t)
	q := planform.CompareQuery(planform.FormOf(pa), planform.FormOf(pb), planform.FigureForm{})

	r := get(t, srv, "/compare")
	wantStatus(t, r, http.StatusSeeOther)
	loc, _ := url.Parse(r.Header.Get("Location"))
	if loc.Path != "/compare" || loc.Query().Get("a.name") != "Hillcrest campus 40 MHz" || loc.Query().Get("b.name") != "Hillcrest campus 40 MHz (copy)" || loc.Query().Get("b.p1.scs") != "30" {
		t.Errorf("GET /compare: Location %s, want the startup plan against its copy", loc)
	}

	r = get(t, srv, "/compare?"+q)
	wantStatus(t, r, http.StatusOK)
	checkPageMarkup(t, "compare", r.body, 1, 2)
	if _, dup := ids(r.body); len(dup) > 0 {
		t.Errorf("ids repeat on the page: %v", dup)
	}
	// One pair of scales; relative to each point A, and the page says why.
	ga, gb := plotAttrs(t, r.body, "a-gl-plot"), plotAttrs(t, r.body, "b-gl-plot")
	if !reflect.DeepEqual(ga, gb) || ga["data-span-tc"] != fmt.Sprint(2*grid.TcPerSubframe) {
		t.Errorf("the plots' scales differ:\nA %v\nB %v", ga, gb)
	}
	wantContains(t, "scale note", r.body, "counted from each plan&#39;s own point A", "neither plan has", "time 0 to 2 ms")
	// Each side's form, with its own keys and ids.
	for _, side := range []string{"a", "b"} {
		wantContains(t, "form "+side, r.body, `id="`+side+`-f-p0-name" name="`+side+`.p0.name" value="broadband"`,
			`name="`+side+`.op" value="add" id="`+side+`-b-add"`, `id="n-`+side+`-f-p0-size"`)
	}
	// The difference table: totals and the partitions matched by name.
	wantContains(t, "totals", r.body,
		`<tr class="gl-changed" data-row="PRBs in partitions"><th scope="row">PRBs in partitions</th><td class="gl-num">106</td><td class="gl-num">126</td><td class="gl-num">+20</td>`,
		`data-row="Channel"><th scope="row">Channel</th><td class="gl-num">40 MHz FR1</td><td class="gl-num">40 MHz FR1</td>`,
		`data-row="Shortest slot µs"><th scope="row">Shortest slot µs</th><td class="gl-num">500.000</td><td class="gl-num">250.000</td><td class="gl-num">−250.000</td>`,
		`data-row="Lower guardband kHz">`, `data-row="Peak downlink Mb/s">`, `data-row="Errors">`)
	wantContains(t, "partitions", r.body,
		`<tr data-part="broadband"><th scope="row">broadband</th><td>A and B</td><td class="gl-num gl-changed" data-col="SCS kHz">30 → 15</td>`,
		`<tr data-part="low-latency"><th scope="row">low-latency</th><td>only in B</td><td class="gl-num" data-col="SCS kHz">60</td>`,
		`data-col="Slot µs">500.000 → 1000.000</td>`)

	// Edits apply per side: B gets a partition, A is untouched.
	r = get(t, srv, "/compare?"+q+"&b.op=add")
	wantStatus(t, r, http.StatusSeeOther)
	loc, _ = url.Parse(r.Header.Get("Location"))
	if loc.Fragment != "b-f-p2-name" || loc.Query().Get("b.p2.name") == "" || loc.Query().Has("a.p1.name") || loc.Query().Has("b.op") {
		t.Errorf("after b.op=add: Location %s", loc)
	}

	// A value B cannot use: 422, kept beside B's control; A's control is clean.
	bad := strings.Replace(q, "b.p1.size=26", "b.p1.size=2x6", 1)
	r = get(t, srv, "/compare?"+bad)
	wantStatus(t, r, http.StatusUnprocessableEntity)
	if got := inputValue(t, r.body, "b-f-p1-size"); got != "2x6" {
		t.Errorf("B's size shows %q", got)
	}
	wantContains(t, "note beside B's size", noteText(t, r.body, "b-f-p1-size"), "not a whole number")
	if n := noteText(t, r.body, "a-f-p0-size"); strings.TrimSpace(n) != "" {
		t.Errorf("A's size has a note: %s", n)
	}

	// The fragment is the workspace alone.
	r = get(t, srv, "/compare/fragment?"+q)
	wantStatus(t, r, http.StatusOK)
	if !strings.HasPrefix(r.body, `<main id="gl-work" class="gl-work gl-compare" data-query="`+strings.ReplaceAll(q, "&", "&amp;")+`"`) {
		t.Errorf("fragment starts %.200s", r.body)
	}
	wantContains(t, "fragment of a bad B", get(t, srv, "/compare/fragment?"+bad).body, `data-status="422"`)
}

// TestCompareAbsolute aligns two absolute plans on absolute frequency, and
// says when one of them has none.
func TestCompareAbsolute(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	campus := testConfig(t).Plan
	moved := campus
	moved.Carrier.CenterMHz = new(3759.99) // on the 15 kHz raster (TS 38.104 5.4.2.1)
	r := get(t, srv, "/compare?"+planform.CompareQuery(planform.FormOf(campus), planform.FormOf(moved), planform.FigureForm{}))
	wantStatus(t, r, http.StatusOK)
	ga, gb := plotAttrs(t, r.body, "a-gl-plot"), plotAttrs(t, r.body, "b-gl-plot")
	abs := func(g map[string]string, k string) int64 {
		var v, pa int64
		fmt.Sscan(g[k], &v)
		fmt.Sscan(g["data-point-a-hz"], &pa)
		return v + pa
	}
	for _, k := range []string{"data-low-hz", "data-high-hz"} {
		if abs(ga, k) != abs(gb, k) {
			t.Errorf("%s + point A: %d in A, %d in B; want one absolute window", k, abs(ga, k), abs(gb, k))
		}
	}
	if ga["data-low-hz"] == gb["data-low-hz"] {
		t.Error("the windows agree from point A too; the plans do not test absolute alignment")
	}
	wantContains(t, "absolute scale note", r.body, "absolute frequency 3728.80 to 3781.19 MHz")

	_, rel := comparePlans(t)
	r = get(t, srv, "/compare?"+planform.CompareQuery(planform.FormOf(campus), planform.FormOf(rel), planform.FigureForm{}))
	wantStatus(t, r, http.StatusOK)
	wantContains(t, "mixed scale note", r.body, "from each plan&#39;s own point A", "plan B has none")
	// A's figure is labelled from point A too, to match B's.
	svgA := r.body[strings.Index(r.body, `aria-labelledby="a-gl-title"`):]
	svgA = svgA[:strings.Index(svgA, "</svg>")]
	if !strings.Contains(svgA, "frequency from point A (MHz)") || strings.Contains(svgA, ">frequency (MHz)<") {
		t.Error("A's figure keeps its absolute axis beside B's relative one")
	}
}

func TestCompareFigures(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	pa, pb := comparePlans(t)
	q := planform.CompareQuery(planform.FormOf(pa), planform.FormOf(pb), planform.FigureForm{Theme: "print"})
	page := get(t, srv, "/compare?"+q)
	for _, side := range []string{"a", "b"} {
		r := get(t, srv, "/compare/figure.svg?side="+side+"&"+q+"&download=1")
		wantStatus(t, r, http.StatusOK)
		checkSVG(t, "compare figure "+side, []byte(r.body))
		name := map[string]string{"a": "30-khz-everywhere-a.svg", "b": "15-60-khz-split-b.svg"}[side]
		wantDisposition(t, r, name)
		// On the shared scales, as on the page.
		if got, want := plotAttrs(t, r.body, "gl-plot"), plotAttrs(t, page.body, side+"-gl-plot"); !reflect.DeepEqual(got, want) {
			t.Errorf("side %s: the download's plot %v differs from the page's %v", side, got, want)
		}
		inner, err := render.PlanFromSVG([]byte(r.body))
		want := map[string]grid.Plan{"a": pa, "b": pb}[side]
		if back, derr := planfile.Decode(inner); err != nil || derr != nil || !reflect.DeepEqual(back, want) {
			t.Errorf("side %s: the figure's plan %+v (%v, %v)", side, back, err, derr)
		}
		p := get(t, srv, "/compare/figure.png?side="+side+"&"+q)
		wantStatus(t, p, http.StatusOK)
		if _, err := png.Decode(strings.NewReader(p.body)); err != nil || p.Header.Get("Content-Type") != "image/png" {
			t.Errorf("side %s PNG: %v, %s", side, err, p.Header.Get("Content-Type"))
		}
	}
	for _, c := range []struct{ query, want string }{
		{"side=c&" + q, "side: \"c\" is not a side of the comparison; use a or b."},
		{q, "side: \"\" is not a side"},
		{"side=b&" + strings.Replace(q, "b.p1.size=26", "b.p1.size=x", 1), "b.partitions[1].sizePrb"},
		{"side=a&" + q + "&fig.width=1", "fig.width"},
	} {
		r := get(t, srv, "/compare/figure.svg?"+c.query)
		wantStatus(t, r, http.StatusUnprocessableEntity)
		wantContains(t, "refusal", r.body, c.want)
	}
}

func TestNamesAreTextInTheComparison(t *testing.T) {
	srv, _ := newTestServer(t, testConfig(t))
	p := hostilePlan(t)
	q := planform.CompareQuery(planform.FormOf(p), planform.CopyOf(planform.FormOf(p)), planform.FigureForm{Caption: evilPlan})
	for _, path := range []string{"/compare?", "/compare/fragment?"} {
		r := get(t, srv, path+q)
		wantStatus(t, r, http.StatusOK)
		scripts := 1
		if path != "/compare?" {
			scripts = 0
		}
		checkPageMarkup(t, path, r.body, scripts, 2)
		for _, side := range []string{"a", "b"} {
			if got := inputValue(t, r.body, side+"-f-p1-name"); got != `&#34;&gt;&lt;svg onload=alert(1)&gt;` {
				t.Errorf("%s: %s's partition name is written %q", path, side, got)
			}
		}
		// The caption the comparison does not show rides along, escaped.
		wantContains(t, path, r.body, `<input type="hidden" name="fig.caption" value="&lt;script&gt;alert(1)&lt;/script&gt;">`)
	}
	for _, side := range []string{"a", "b"} {
		r := get(t, srv, "/compare/figure.svg?side="+side+"&"+q)
		wantStatus(t, r, http.StatusOK)
		checkSVG(t, "compare figure "+side, []byte(r.body), evilTexts...)
	}
}

func TestPresentRoutesMethodsAndLimits(t *testing.T) {
	// Every new route answers HEAD as GET, and refuses other methods.
	srv, _ := newTestServer(t, testConfig(t))
	for _, path := range []string{"/walk", "/compare", "/compare/fragment", "/compare/figure.svg", "/compare/figure.png", "/figure.png"} {
		req, _ := http.NewRequest(http.MethodPost, srv.URL+path, nil)
		if r := do(t, req); r.StatusCode != http.StatusMethodNotAllowed || r.Header.Get("Allow") != "GET, HEAD" {
			t.Errorf("POST %s: %d, Allow %q", path, r.StatusCode, r.Header.Get("Allow"))
		}
		if r := get(t, srv, path+"?"+campusQuery(t)+"&pad="+strings.Repeat("x", MaxQuery)); r.StatusCode != http.StatusRequestURITooLong {
			t.Errorf("GET %s with a long query: %d, want 414", path, r.StatusCode)
		}
	}
}

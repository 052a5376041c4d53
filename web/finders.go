package web

import (
	"net/http"

	"gridloom/grid"
	"gridloom/grid/report"
	"gridloom/web/planform"
)

// The two finders: where the SS/PBCH block can sit on the synchronization
// raster (grid.SSBPositions), and which block position, controlResourceSetZero
// and searchSpaceZero pass the initial-access checks (grid.FindInitialAccess).
// Both run only on request, on their own page or API route, never with
// the planner page: the initial-access search computes the plan once per
// GSCN and checks every pdcch-ConfigSIB1 there, about 180 MB on the
// heaviest plan, so one runs at a time (findSlot).

// findSlot lets one initial-access search run at a time; the others wait
// for it or for their request to end.
var findSlot = make(chan struct{}, 1)

// takeFindSlot waits for findSlot; it fails when the request ends first.
func takeFindSlot(r *http.Request) (release func(), err error) {
	select {
	case findSlot <- struct{}{}:
		return func() { <-findSlot }, nil
	case <-r.Context().Done():
		return nil, &problem{status: http.StatusServiceUnavailable, text: "The initial-access search was not run: the request ended while another search was running. Try again."}
	}
}

// findBand is the band a finder searches: the band= query key, or the
// plan's carrier.band.
func findBand(r *http.Request, p grid.Plan) string {
	if b := r.URL.Query().Get("band"); b != "" {
		return b
	}
	return p.Carrier.Band
}

// notSearchable is a 422 for a plan a finder cannot search, in the
// finder's own sentence.
func notSearchable(err error) *problem {
	return &problem{status: http.StatusUnprocessableEntity, text: "The search could not run: " + err.Error() + "."}
}

// apiSSB answers POST /api/v1/ssb: the JSON of `gridloom ssb -format json`.
func (s *server) apiSSB(w http.ResponseWriter, r *http.Request) error {
	plan, notes, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	found, err := grid.SSBPositions(plan, findBand(r, plan))
	if err != nil {
		return notSearchable(err)
	}
	if err := sendJSONImport(w, r, http.StatusOK, report.BuildSSBPositions(found), notes); err != nil {
		return internal("SS/PBCH positions", err)
	}
	return nil
}

// apiInitial answers POST /api/v1/initial: the JSON of `gridloom initial
// -format json`, with 422 when no combination passes, as the command
// exits with the plan-errors code.
func (s *server) apiInitial(w http.ResponseWriter, r *http.Request) error {
	plan, notes, err := readAPIPlan(r)
	if err != nil {
		return err
	}
	release, err := takeFindSlot(r)
	if err != nil {
		return err
	}
	defer release()
	found, err := grid.FindInitialAccess(plan, findBand(r, plan))
	if err != nil {
		return notSearchable(err)
	}
	doc := report.BuildInitialOptions(found, grid.Compute(plan).Channel)
	status := http.StatusOK
	if len(doc.Options) == 0 {
		status = http.StatusUnprocessableEntity
	}
	if err := sendJSONImport(w, r, status, doc, notes); err != nil {
		return internal("initial-access options", err)
	}
	return nil
}

// findSSBPage serves /find/ssb: the GSCNs where the query's block fits,
// each a link to the plan with it.
func (s *server) findSSBPage(w http.ResponseWriter, r *http.Request) error {
	st := planform.ReadPlan(r.URL.RawQuery)
	found, err := grid.SSBPositions(st.Plan, st.Plan.Carrier.Band)
	v := ssbFindView(st, found, err)
	return writeHTML(w, r, http.StatusOK, findPage(v), nil)
}

// findInitialPage serves /find/initial: the ranked initial-access
// settings for the query's plan, each a link to the plan with them.
func (s *server) findInitialPage(w http.ResponseWriter, r *http.Request) error {
	st := planform.ReadPlan(r.URL.RawQuery)
	release, err := takeFindSlot(r)
	if err != nil {
		return err
	}
	defer release()
	found, err := grid.FindInitialAccess(st.Plan, st.Plan.Carrier.Band)
	v := initialFindView(st, found, err)
	return writeHTML(w, r, http.StatusOK, findPage(v), nil)
}

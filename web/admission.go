package web

import (
	"fmt"
	"net/http"
	"strconv"
	"time"
)

// admission bounds the heavy work running at once: PNG figures, the
// exports of large plans, the API, comparisons and the printed
// walkthrough each cost tens of milliseconds to seconds of a core and up
// to tens of megabytes. Without a bound, 64 clients asking for the PNG of
// the largest plan took 2.6 GB and every answer passed 20 s; with it, a
// request waits a short while for a slot and is otherwise told, with 503
// and Retry-After, to come back, while the light routes (the page, its
// fragment, cached figures, the assets) are never held up by it.
type admission struct {
	slots chan struct{}
	wait  time.Duration
}

// Admission defaults: one slot per processor Go schedules on
// (runtime.GOMAXPROCS), since heavy work is bound by the processor and
// more of it at once only holds more memory for the same throughput; and a
// wait of one second, about the time of the heaviest PNG on this class of
// machine, so a short burst is queued rather than refused.
const defaultHeavyWait = time.Second

// retryAfterSeconds is the Retry-After of a refusal.
const retryAfterSeconds = 1

func newAdmission(slots int, wait time.Duration) *admission {
	return &admission{slots: make(chan struct{}, max(1, slots)), wait: wait}
}

// heavy runs h once a slot is free, waiting at most a.wait; it answers 503
// with Retry-After when none frees up in time, and nothing when the client
// leaves while waiting.
func (a *admission) heavy(h handlerFunc) handlerFunc {
	return func(w http.ResponseWriter, r *http.Request) error {
		select {
		case a.slots <- struct{}{}:
		default:
			t := time.NewTimer(a.wait)
			defer t.Stop()
			select {
			case a.slots <- struct{}{}:
			case <-r.Context().Done():
				return r.Context().Err()
			case <-t.C:
				w.Header().Set("Retry-After", strconv.Itoa(retryAfterSeconds))
				return &problem{status: http.StatusServiceUnavailable,
					text: fmt.Sprintf("gridloom is busy: it draws or exports at most %d heavy answers at once (PNG figures, symbol tables, the API, comparisons, printed walkthroughs) and all are taken. Try again in %d second.", cap(a.slots), retryAfterSeconds)}
			}
		}
		defer func() { <-a.slots }()
		if err := r.Context().Err(); err != nil {
			return err // left while waiting: the work would be for no one
		}
		return h(w, r)
	}
}

// heavyWhen is heavy for the requests that need tells apart, and h
// unbounded for the others.
func (a *admission) heavyWhen(need func(*http.Request) bool, h handlerFunc) handlerFunc {
	bounded := a.heavy(h)
	return func(w http.ResponseWriter, r *http.Request) error {
		if need(r) {
			return bounded(w, r)
		}
		return h(w, r)
	}
}

package web

import (
	"context"
	"fmt"
	"io"
	"net/http"
	"runtime"
	"strconv"
	"sync"
	"time"
)

// admission bounds the heavy work running at once: PNG figures, the
// exports of large plans, the API, comparisons, the finders and the printed
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
// (runtime.GOMAXPROCS) but one, and at least one: heavy work is bound by
// the processor, more of it at once only holds more memory for the same
// throughput, and the processor left over keeps the light routes quick
// (on the 2-core machine, one slot instead of two took the page's p99
// under a flood of printed walkthroughs from 191 to 60 ms, median of three
// interleaved runs, and no fewer heavy answers; DEVELOPERS.md). And a wait
// of one second, about the time of the heaviest PNG on this class of
// machine, so a short burst is queued rather than refused.
const defaultHeavyWait = time.Second

func defaultHeavySlots() int { return max(1, runtime.GOMAXPROCS(0)-1) }

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

// pacer shares one rate, in bytes per second, among all the writers of
// large kept answers (the figures' cache). A kept answer costs no drawing,
// only copying, so admission lets it through; but 64 clients fetching the
// 4800 px PNG of the largest plan (743 KB) again and again copied 2.6 GB/s
// and took both processors of a small machine, the kernel's share and
// theirs, and the light routes' p99 rose past 50 ms. Paced, the flood
// costs a bounded part of the machine however many join it, each large
// answer still leaves at once when the line is idle (the burst), and the
// writers share the rate first come, first served.
type pacer struct {
	perSecond float64
	burst     time.Duration    // credit an idle line builds up
	now       func() time.Time // time.Now but in tests

	mu   sync.Mutex
	next time.Time // when the line has sent all it has booked
}

// Pacing defaults: large kept answers share defaultPaceRate; an answer
// over paceOver bytes is paced, in chunks of paceChunk; an idle line lets
// paceBurst bytes leave at once, so one user's largest figure never waits.
const (
	defaultPaceRate = 128 << 20
	paceOver        = 256 << 10
	paceChunk       = 64 << 10
	paceBurst       = 1 << 20
)

func newPacer(bytesPerSecond int) *pacer {
	r := float64(bytesPerSecond)
	return &pacer{perSecond: r, burst: time.Duration(paceBurst / r * float64(time.Second)), now: time.Now}
}

// reserve books n bytes on the line and returns how long to wait before
// they may leave: until the line, at its rate, has paid for them and all
// booked before them, less the credit of an idle line (a token bucket of
// paceBurst bytes).
func (p *pacer) reserve(n int) time.Duration {
	p.mu.Lock()
	defer p.mu.Unlock()
	now := p.now()
	if floor := now.Add(-p.burst); p.next.Before(floor) {
		p.next = floor
	}
	p.next = p.next.Add(time.Duration(float64(n) / p.perSecond * float64(time.Second)))
	return p.next.Sub(now)
}

// wait returns when n more bytes may leave, or with ctx's error when the
// client goes first.
func (p *pacer) wait(ctx context.Context, n int) error {
	d := p.reserve(n)
	if d <= 0 {
		return nil
	}
	t := time.NewTimer(d)
	defer t.Stop()
	select {
	case <-t.C:
		return nil
	case <-ctx.Done():
		return ctx.Err()
	}
}

// write writes body to w, paced when it is over paceOver bytes.
func (p *pacer) write(ctx context.Context, w io.Writer, body []byte) error {
	if p == nil || len(body) <= paceOver {
		_, err := w.Write(body)
		return err
	}
	for len(body) > 0 {
		n := min(len(body), paceChunk)
		if err := p.wait(ctx, n); err != nil {
			return err
		}
		if _, err := w.Write(body[:n]); err != nil {
			return err
		}
		body = body[n:]
	}
	return nil
}

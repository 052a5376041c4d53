package web

import (
	"bytes"
	"compress/gzip"
)

// spares keeps up to a fixed number of values for reuse by any goroutine,
// across garbage collections. A sync.Pool did not suit the compressors and
// page buffers: what one processor puts back another cannot take, and a
// second collection drops it, so in the fragment benchmark every other
// answer made a new gzip writer (600 KiB of tables, zeroed).
type spares[T any] struct {
	free  chan T
	fresh func() T
}

func newSpares[T any](n int, fresh func() T) *spares[T] {
	return &spares[T]{free: make(chan T, n), fresh: fresh}
}

// get returns a spare, or a fresh value when none is free.
func (s *spares[T]) get() T {
	select {
	case v := <-s.free:
		return v
	default:
		return s.fresh()
	}
}

// put keeps v for a later get, or drops it when enough are kept.
func (s *spares[T]) put(v T) {
	select {
	case s.free <- v:
	default:
	}
}

// gzipWriters are the compressors of pages and figures; two cover the
// requests a local app serves at once (a busier moment makes more, and
// drops them after).
var gzipWriters = newSpares(2, func() *gzip.Writer {
	zw, _ := gzip.NewWriterLevel(nil, compressLevel)
	return zw
})

// gzipBytes compresses b into dst with a spare compressor.
func gzipBytes(dst *bytes.Buffer, b []byte) error {
	zw := gzipWriters.get()
	defer gzipWriters.put(zw)
	zw.Reset(dst)
	if _, err := zw.Write(b); err != nil {
		return err
	}
	return zw.Close()
}

// buffers hold pages while they are rendered and compressed: a fragment
// grows one to 60-70 KiB and its gzip form to 16 KiB; four serve two
// requests at once.
var buffers = newSpares(4, func() *bytes.Buffer { return new(bytes.Buffer) })

func getBuffer() *bytes.Buffer {
	b := buffers.get()
	b.Reset()
	return b
}

// putBuffer keeps b unless it grew past 256 KiB (a page far above the
// usual), so that a rare large answer does not stay in memory for good.
func putBuffer(b *bytes.Buffer) {
	if b.Cap() <= 256<<10 {
		buffers.put(b)
	}
}

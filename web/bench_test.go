package web

import (
	"io"
	"log/slog"
	"net/http"
	"net/http/httptest"
	"os"
	"testing"

	"gridloom/grid/planfile"
)

// Benchmarks of the live update: what one edit costs the server, from the
// query to the finished fragment (compute, figure, markup).
//
//	go test ./web -run '^$' -bench . -benchmem

func benchmarkFragment(b *testing.B, query string) {
	h := NewServer(slog.New(slog.NewTextHandler(io.Discard, nil)), Config{})
	req := httptest.NewRequest(http.MethodGet, "/fragment?"+query, nil)
	b.ReportAllocs()
	for b.Loop() {
		w := httptest.NewRecorder()
		h.ServeHTTP(w, req)
		if w.Code != http.StatusOK {
			b.Fatalf("status %d", w.Code)
		}
	}
}

func BenchmarkFragmentCampus(b *testing.B) {
	data, err := os.ReadFile("../testdata/plans/campus.yaml")
	if err != nil {
		b.Fatal(err)
	}
	p, err := planfile.DecodeYAML(data)
	if err != nil {
		b.Fatal(err)
	}
	benchmarkFragment(b, FormOf(p).Query())
}

// BenchmarkFragmentStress is the heaviest plan a user can ask for.
func BenchmarkFragmentStress(b *testing.B) {
	data, err := os.ReadFile("../testdata/stress/fr2-2-2000mhz.yaml")
	if err != nil {
		b.Fatal(err)
	}
	p, err := planfile.DecodeYAML(data)
	if err != nil {
		b.Fatal(err)
	}
	benchmarkFragment(b, FormOf(p).Query())
}

package web

import (
	"bytes"
	"io/fs"
	"mime"
	"net/http"
	"path"
	"strings"
	"sync"

	"gridloom/static"
)

// assets are the embedded script, stylesheet and icon, each kept with its
// ETag and, for the types worth it, compressed once: they go out through
// the same cachedResponse.send as a kept figure.
type assets struct {
	once  sync.Once
	files map[string]*cachedResponse // by name under /static/
}

func newAssets() *assets { return &assets{} }

// load reads every regular file of fsys but the Go source that embeds them.
func (a *assets) load(fsys fs.FS) {
	a.files = map[string]*cachedResponse{}
	_ = fs.WalkDir(fsys, ".", func(p string, d fs.DirEntry, err error) error {
		if err != nil || d.IsDir() || strings.HasSuffix(p, ".go") {
			return err
		}
		b, err := fs.ReadFile(fsys, p)
		if err != nil {
			return err
		}
		ctype := mime.TypeByExtension(path.Ext(p))
		e := &cachedResponse{query: p, body: b, header: http.Header{
			"Content-Type":  {ctype},
			"Etag":          {etagOf(b)},
			"Cache-Control": {"no-cache"},
		}}
		if isCompressible(ctype) {
			var gz bytes.Buffer
			if gzipBytes(&gz, b) == nil {
				e.gz = gz.Bytes()
			}
		}
		a.files[p] = e
		return nil
	})
}

// serve serves the embedded assets with an ETag, so that browsers
// revalidate them cheaply and never run a stale script after an upgrade.
// Only files are served, no listings.
func (a *assets) serve(w http.ResponseWriter, r *http.Request) error {
	a.once.Do(func() { a.load(static.FS) })
	name := strings.TrimPrefix(path.Clean(strings.TrimPrefix(r.URL.Path, "/static")), "/")
	e, ok := a.files[name]
	if !ok {
		return &problem{status: http.StatusNotFound, text: "There is no " + r.URL.Path + "."}
	}
	e.send(w, r)
	return nil
}

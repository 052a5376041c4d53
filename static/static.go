// Package static holds the web app's assets: its stylesheet, its script and
// its icon, embedded so the app needs no network, no CDN and no web fonts.
package static

import "embed"

// FS holds the assets at its root: app.css, app.js and icon.svg.
//
//go:embed app.css app.js icon.svg
var FS embed.FS

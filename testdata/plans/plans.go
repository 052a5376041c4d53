// Package plans embeds the demo plans, so that the web app can offer them
// and open with one without reading files at run time. The plans are
// invented scenarios.
package plans

import "embed"

// FS holds the demo plan files at its root: campus.yaml, port.yaml and
// stadium.yaml.
//
//go:embed *.yaml
var FS embed.FS

// Default is the file name of the plan the app opens with.
const Default = "campus.yaml"

package main

import (
	"fmt"
	"io"
	"runtime/debug"

	"gridloom/grid"
)

// runVersion prints the module version, the VCS state the binary was built
// from (when the build recorded it), the Go version and the 3GPP release.
func runVersion(args []string, stdout, stderr io.Writer) error {
	fs := newFlags("version", "", stderr)
	if err := parseFlags(fs, args); err != nil {
		return err
	}
	if fs.NArg() > 0 {
		fs.Usage()
		return &exitError{code: exitBadInput, msg: fmt.Sprintf("version takes no arguments, but got %q", fs.Arg(0))}
	}
	fmt.Fprint(stdout, versionText(debug.ReadBuildInfo()))
	return nil
}

// versionText is what version prints for the build information bi (ok
// false when the binary carries none).
func versionText(bi *debug.BuildInfo, ok bool) string {
	version, vcs, goVersion := "(unknown)", "", ""
	if ok {
		version, goVersion = bi.Main.Version, bi.GoVersion
		if version == "" {
			version = "(devel)"
		}
		var rev, when, modified string
		for _, s := range bi.Settings {
			switch s.Key {
			case "vcs.revision":
				rev = s.Value
			case "vcs.time":
				when = s.Value
			case "vcs.modified":
				if s.Value == "true" {
					modified = ", with uncommitted changes"
				}
			}
		}
		if rev != "" {
			vcs = rev
			if when != "" {
				vcs += " (" + when + modified + ")"
			} else if modified != "" {
				vcs += " (" + modified[2:] + ")"
			}
		}
	}
	out := "gridloom " + version + "\n"
	if vcs != "" {
		out += "commit: " + vcs + "\n"
	}
	if goVersion != "" {
		out += "go: " + goVersion + "\n"
	}
	return out + "spec: " + grid.Spec + "\n"
}

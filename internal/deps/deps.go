// Package deps pins the project's third-party modules while the packages
// that use them are being written. It is removed once every module is
// imported by real code.
package deps

import (
	_ "github.com/BurntSushi/toml"
	_ "github.com/chromedp/chromedp"
	_ "github.com/schollz/progressbar/v3"
	_ "github.com/spf13/cobra"
	_ "golang.org/x/term"
	_ "gonum.org/v1/gonum/mat"
	_ "gonum.org/v1/plot"
	_ "gonum.org/v1/plot/vg/vgsvg"
)

package main

import (
	"bytes"
	"strings"
	"testing"
)

// qaRun runs the command line args and returns the exit code and streams.
func qaRun(args ...string) (code int, out, errOut string) {
	var o, e bytes.Buffer
	f := &Factory{In: strings.NewReader(""), Out: &o, Err: &e}
	code = Main(args, f)
	return code, o.String(), e.String()
}

// TestFieldFlagRange: an explicit --field that is not a 1H frequency in MHz
// (zero, negative, NaN, a value in Hz or GHz) is a usage error, exit 1, that
// names the flag. Before, --field 0 silently meant 400 MHz and --field 1e9
// (Hz typed for MHz) was accepted. 1H observe frequencies run from about
// 40 MHz (benchtop) to about 1.2 GHz (common practice, no source).
func TestFieldFlagRange(t *testing.T) {
	spins := "../../testdata/spins/ab.toml"
	for _, v := range []string{"0", "-400", "NaN", "+Inf", "1e9", "400e6", "0.4"} {
		for _, args := range [][]string{
			{"predict", "CCO", "--field", v},
			{"simulate", spins, "--field", v},
		} {
			code, out, errOut := qaRun(args...)
			if code != exitError || out != "" || !strings.Contains(errOut, "--field") {
				t.Errorf("%q: exit %d, out %q, err %q; want exit 1 naming --field", args, code, out, errOut)
			}
		}
	}
	for _, v := range []string{"43", "60", "400", "1200"} {
		for _, args := range [][]string{
			{"predict", "CCO", "--field", v},
			{"simulate", spins, "--field", v},
		} {
			if code, _, errOut := qaRun(args...); code != exitOK {
				t.Errorf("%q: exit %d: %s", args, code, errOut)
			}
		}
	}
}

package compare

import (
	"sync"
	"sync/atomic"
	"testing"

	"shiftwise/predict"
)

// TestSharedPredictions: concurrent requests for one key compute the
// prediction once and all get the same one; another SMILES, field or
// solvent is a separate entry; errors are shared too.
func TestSharedPredictions(t *testing.T) {
	var calls atomic.Int64
	base := func(smi string, field float64, solvent string) (*predict.Prediction, error) {
		calls.Add(1)
		return &predict.Prediction{Smiles: smi}, nil
	}
	var c SharedPredictions
	pr := c.Predictor(Options{Predictor: base})
	var wg sync.WaitGroup
	got := make([]*predict.Prediction, 16)
	for i := range got {
		wg.Add(1)
		go func() {
			defer wg.Done()
			got[i], _ = pr("CCO", 400, "CDCl3")
		}()
	}
	wg.Wait()
	if calls.Load() != 1 {
		t.Errorf("%d predictions for one key, want 1", calls.Load())
	}
	for _, p := range got {
		if p != got[0] {
			t.Fatal("requests for one key got different predictions")
		}
	}
	for _, k := range []struct {
		smi     string
		field   float64
		solvent string
	}{{"CCC", 400, "CDCl3"}, {"CCO", 60, "CDCl3"}, {"CCO", 400, "DMSO-d6"}} {
		if p, _ := pr(k.smi, k.field, k.solvent); p == got[0] {
			t.Errorf("%+v shares the CCO/400/CDCl3 prediction", k)
		}
	}
	if calls.Load() != 4 {
		t.Errorf("%d predictions for four keys, want 4", calls.Load())
	}
	// Beyond MaxShared entries nothing more is kept: a new structure is
	// predicted on every request.
	for i := 0; len(c.m) < MaxShared; i++ {
		pr("C", float64(i), "CDCl3")
	}
	before := calls.Load()
	pr("CCCCO", 400, "CDCl3")
	pr("CCCCO", 400, "CDCl3")
	if n := calls.Load() - before; n != 2 || len(c.m) != MaxShared {
		t.Errorf("past the bound: %d predictions for two requests and %d entries, want 2 and %d", n, len(c.m), MaxShared)
	}
}

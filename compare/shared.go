package compare

import (
	"sync"

	"shiftwise/predict"
)

// SharedPredictions memoizes the default predictor across checks, such as
// the samples of a batch: QC batches often hold many samples of one
// product, and the prediction of a molecule with a large strongly coupled
// cluster (long alkyl chains, steroid rings) can take tens of ms. Each
// prediction is computed once per SMILES, field, solvent, mode and line
// width, also when requested concurrently, and then shared: Check only
// reads predictions. To bound memory (a 60 MHz prediction can hold 100,000
// lines), at most MaxShared predictions are kept; further structures are
// predicted for each request. The zero value is ready to use.
type SharedPredictions struct {
	mu sync.Mutex
	m  map[sharedKey]*sharedEntry
}

// MaxShared is the number of predictions a SharedPredictions keeps.
const MaxShared = 64

type sharedKey struct {
	smiles, solvent string
	field, width    float64
	mode            int
}

type sharedEntry struct {
	once sync.Once
	p    *predict.Prediction
	err  error
}

// Predictor returns a Predictor for opt (set it as opt.Predictor) that
// takes its predictions from the cache, computing missing ones with
// opt.Predictor, or the default predictor when that is nil.
func (c *SharedPredictions) Predictor(opt Options) Predictor {
	base := opt.Predictor
	if base == nil {
		base = defaultPredictor(opt)
	}
	return func(smi string, field float64, solvent string) (*predict.Prediction, error) {
		k := sharedKey{smiles: smi, solvent: solvent, field: field, width: opt.LineWidthHz, mode: int(opt.Mode)}
		c.mu.Lock()
		if c.m == nil {
			c.m = map[sharedKey]*sharedEntry{}
		}
		e := c.m[k]
		if e == nil {
			if len(c.m) >= MaxShared {
				c.mu.Unlock()
				return base(smi, field, solvent)
			}
			e = &sharedEntry{}
			c.m[k] = e
		}
		c.mu.Unlock()
		e.once.Do(func() { e.p, e.err = base(smi, field, solvent) })
		return e.p, e.err
	}
}

package compare

import (
	"shiftwise/predict"
	"shiftwise/smiles"
)

func init() {
	defaultPredictor = func(opt Options) Predictor {
		return func(smi string, field float64, solvent string) (*predict.Prediction, error) {
			m, err := smiles.Parse(smi)
			if err != nil {
				return nil, err
			}
			return predict.Predict(m, smi, predict.Options{FieldMHz: field, Solvent: solvent, Mode: opt.Mode, LineWidthHz: opt.LineWidthHz})
		}
	}
}

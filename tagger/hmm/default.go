package hmm

import (
	"errors"
	"sync"

	"glossmith/tagger/model"
)

var (
	defaultOnce  sync.Once
	defaultModel *Model
	defaultErr   error
)

// Default returns the model embedded in the binary (trained on UD English
// EWT 2.15), decoded on first use.
func Default() (*Model, error) {
	defaultOnce.Do(func() {
		if len(model.EnglishEWT) == 0 {
			defaultErr = errors.New("this glossmith was built without its default tagger model; pass --model FILE")
			return
		}
		defaultModel, defaultErr = Decode(model.EnglishEWT)
		var fe *FormatError
		if errors.As(defaultErr, &fe) {
			fe.File = "embedded " + model.Name
		}
	})
	return defaultModel, defaultErr
}

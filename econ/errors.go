package econ

import "errors"

// Classes of error; test with errors.Is.
var (
	ErrTariff   = errors.New("econ: tariff")
	ErrSeries   = errors.New("econ: energy series")
	ErrRetrofit = errors.New("econ: retrofit")
)

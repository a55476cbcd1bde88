package spectrum

func readCSVBytes(data []byte, name string, opt ReadOptions) (*Spectrum, error) {
	return nil, errorf(name, 1, "CSV input is not supported yet")
}

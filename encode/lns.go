package encode

func (o *optRun) lns() error { return nil }

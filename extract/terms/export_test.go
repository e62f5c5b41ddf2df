package terms

// TableBytes exposes the full size estimate to the tests.
func TableBytes(c *Corpus) int64 { return c.tableBytes() }

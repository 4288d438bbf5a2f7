package index

import "strconv"

func strconvItoa(n int) string { return strconv.Itoa(n) }

// Package config decodes, validates and fills defaults for a rebound
// configuration file (TOML).
//
// Decoding is strict: the file is decoded onto Default(), and any key the
// schema does not know is an error that names the key, its line and the
// closest valid key ("did you mean"). Values with a closed set of choices or
// a range (method names, weights, the AHP matrix) are checked while decoding,
// so their errors carry the line and column of the offending value. Checks
// that span several keys (an AHP order naming an unknown indicator, a
// frequency indicator with no record length) run afterwards in Validate and
// name the key path, e.g. `indicator[3].weight`, with its line when the key
// can be found in the file.
//
// Paths inside the file are relative to the directory holding the file.
// Template returns a fully commented configuration that documents every key
// and its default; `rebound init` writes it.
package config

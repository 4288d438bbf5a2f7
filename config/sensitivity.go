package config

// Sensitivity configures the robustness analysis of the ranking. The
// section's keys are documented in the template.
type Sensitivity struct{}

// DefaultSensitivity returns the sensitivity defaults.
func DefaultSensitivity() *Sensitivity { return &Sensitivity{} }

func (c *Config) validateSensitivity(bad reportFunc) {}

const templateSensitivity = ``

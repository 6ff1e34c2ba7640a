package samples

import (
	"fmt"
	"math"
	"time"
)

// Config sizes a synthetic term. Only Sections and Seed are needed; the other
// fields have defaults (their zero value) that give the usual grid of Monday
// to Friday, nine one-hour periods a day from 08:00 with a lunch hour after
// the fourth, and a twelve-week term from Monday 13 September 2027.
type Config struct {
	Sections      int       // number of sections, 1 to MaxSections
	Seed          uint64    // seed of the random source; equal configs give equal terms
	Days          int       // teaching days a week from Monday, 1 to 7; 0 means 5
	PeriodsPerDay int       // one-hour periods a day, 2 to 13; 0 means 9
	Weeks         int       // teaching weeks, 1 to 52; 0 means 12
	FirstDay      time.Time // first teaching day (a date); zero means 2027-09-13
	Name          string    // term name; "" means "Autumn 2027"
}

// MaxSections is the largest section count Generate accepts.
const MaxSections = 100_000

// DemoConfig is the configuration of the checked-in demo term
// (demo-term.xlsx): about 150 sections for Quillmere Polytechnic.
var DemoConfig = Config{Sections: 150, Seed: 2027}

// Validate reports a config the generator cannot honour, saying which field
// is wrong and what range it takes.
func (c Config) Validate() error {
	switch {
	case c.Sections < 1 || c.Sections > MaxSections:
		return fmt.Errorf("sections must be from 1 to %d, not %d", MaxSections, c.Sections)
	case c.Days < 0 || c.Days > 7:
		return fmt.Errorf("days must be from 1 to 7 (0 for the default 5), not %d", c.Days)
	case c.PeriodsPerDay < 0 || c.PeriodsPerDay == 1 || c.PeriodsPerDay > 13:
		return fmt.Errorf("periods per day must be from 2 to 13 (0 for the default 9), not %d", c.PeriodsPerDay)
	case c.Weeks < 0 || c.Weeks > 52:
		return fmt.Errorf("weeks must be from 1 to 52 (0 for the default 12), not %d", c.Weeks)
	}
	return nil
}

// withDefaults fills zero fields with their defaults.
func (c Config) withDefaults() Config {
	if c.Days == 0 {
		c.Days = 5
	}
	if c.PeriodsPerDay == 0 {
		c.PeriodsPerDay = 9
	}
	if c.Weeks == 0 {
		c.Weeks = 12
	}
	if c.FirstDay.IsZero() {
		c.FirstDay = time.Date(2027, time.September, 13, 0, 0, 0, 0, time.UTC)
	} else {
		y, m, d := c.FirstDay.Date()
		c.FirstDay = time.Date(y, m, d, 0, 0, 0, 0, time.UTC)
	}
	if c.Name == "" {
		c.Name = "Autumn 2027"
	}
	return c
}

// Proportions derived from the section count S (common practice for the
// shape of a faculty or university term, tuned so that about 150 sections
// give about 30 rooms, 70 staff and 25 cohorts, and 2,000 sections about 250
// rooms, 700 staff and 300 cohorts).

// departmentCount is about half the square root of S, at most one per subject.
func departmentCount(s int) int {
	return clamp(int(math.Round(math.Sqrt(float64(s))/2)), 1, len(subjects))
}

// electiveCount is about 8% of the sections.
func electiveCount(s int) int { return int(math.Round(float64(s) * 0.08)) }

// staffTarget is the number of staff aimed at: about 0.47 per section for a
// small term, falling slowly as terms grow (more sections per person); it
// grows like S^(7/8).
func staffTarget(s int) int {
	return max(1, int(math.Round(0.873*float64(s)/eighthRoot(float64(s)))))
}

// roomUtilisation is the share of room-periods the rooms are sized to be
// busy: 22% for 150 sections, growing like S^(1/4) to at most 60%.
func roomUtilisation(s int) float64 {
	return math.Min(0.6, 0.22*math.Sqrt(math.Sqrt(float64(s)/150)))
}

// eighthRoot uses only square roots, which IEEE 754 rounds exactly on every
// machine (unlike math.Pow or math.Log), so that generated terms are the
// same everywhere. For the same reason no expression here has the form
// a*b+c, which a compiler may fuse into one rounding on some machines.
func eighthRoot(x float64) float64 { return math.Sqrt(math.Sqrt(math.Sqrt(x))) }

func clamp(v, lo, hi int) int { return max(lo, min(v, hi)) }

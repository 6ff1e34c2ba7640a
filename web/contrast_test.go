package web

import (
	"fmt"
	"math"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// relLuminance is the relative luminance of an sRGB colour "#rrggbb" or
// "rgb(r, g, b)", by the definition in WCAG 2.1 (Understanding SC 1.4.3,
// "relative luminance": each channel c/255, linearised as c/12.92 when
// c <= 0.03928, else ((c+0.055)/1.055)^2.4; L = 0.2126 R + 0.7152 G + 0.0722 B).
func relLuminance(t *testing.T, colour string) float64 {
	t.Helper()
	var rgb [3]float64
	switch {
	case strings.HasPrefix(colour, "#") && len(colour) == 7:
		for i := range rgb {
			v, err := strconv.ParseUint(colour[1+2*i:3+2*i], 16, 8)
			require.NoError(t, err, colour)
			rgb[i] = float64(v)
		}
	case strings.HasPrefix(colour, "rgb"):
		nums := regexp.MustCompile(`[0-9.]+`).FindAllString(colour, -1)
		require.GreaterOrEqual(t, len(nums), 3, colour)
		for i := range rgb {
			v, err := strconv.ParseFloat(nums[i], 64)
			require.NoError(t, err)
			rgb[i] = v
		}
	default:
		t.Fatalf("colour %q is neither #rrggbb nor rgb()", colour)
	}
	lin := func(c float64) float64 {
		c /= 255
		if c <= 0.03928 {
			return c / 12.92
		}
		return math.Pow((c+0.055)/1.055, 2.4)
	}
	return 0.2126*lin(rgb[0]) + 0.7152*lin(rgb[1]) + 0.0722*lin(rgb[2])
}

// contrast is the WCAG 2.1 contrast ratio (L1 + 0.05) / (L2 + 0.05), L1 the lighter.
func contrast(t *testing.T, a, b string) float64 {
	la, lb := relLuminance(t, a), relLuminance(t, b)
	if la < lb {
		la, lb = lb, la
	}
	return (la + 0.05) / (lb + 0.05)
}

// cssVars reads the custom properties of :root in the page's style sheet.
func cssVars(t *testing.T) map[string]string {
	css, err := assetFS.ReadFile("assets/style.css")
	require.NoError(t, err)
	root := regexp.MustCompile(`:root\s*\{([^}]*)\}`).FindSubmatch(css)
	require.NotNil(t, root)
	out := map[string]string{}
	for _, m := range regexp.MustCompile(`--([a-z-]+):\s*(#[0-9a-fA-F]{6})`).FindAllSubmatch(root[1], -1) {
		out[string(m[1])] = string(m[2])
	}
	return out
}

func TestContrastFormula(t *testing.T) {
	// WCAG 2.1 definition of contrast ratio: ratios range from 1:1 to 21:1 (black on white).
	assert.InDelta(t, 21, contrast(t, "#000000", "#ffffff"), 1e-9)
	assert.InDelta(t, 1, contrast(t, "#0b4f6c", "#0b4f6c"), 1e-9)
	assert.InDelta(t, 21, contrast(t, "rgb(0, 0, 0)", "rgb(255, 255, 255)"), 1e-9)
}

// TestContrastOfPageColours checks every text and background pair of the
// style sheet's colours, the locked-meeting colours added for locks
// included, against WCAG 2.1 SC 1.4.3 (contrast minimum: 4.5:1 for
// normal text) and the focus outline and the locked meetings' border
// against SC 1.4.11 (non-text contrast: 3:1).
func TestContrastOfPageColours(t *testing.T) {
	v := cssVars(t)
	for _, k := range []string{"ink", "paper", "accent", "warn", "ok", "soft", "lock", "lock-bg"} {
		require.Contains(t, v, k, "style.css defines --%s", k)
	}
	const focus, white, target = "#c25e00", "#ffffff", "#f4f9ff"
	for _, c := range []struct {
		fg, bg, what string
		min          float64
	}{
		{v["ink"], v["paper"], "body text", 4.5},
		{v["ink"], v["soft"], "table headers, picked panel", 4.5},
		{v["ink"], target, "text in a cell a meeting can move to", 4.5},
		{v["accent"], white, "button text", 4.5},
		{v["accent"], v["paper"], "download links", 4.5},
		{v["accent"], v["soft"], "button text on hover", 4.5},
		{white, v["accent"], "a chosen meeting", 4.5},
		{v["warn"], v["paper"], "“Not allowed.” and problems", 4.5},
		{v["ok"], v["paper"], "“Allowed.”", 4.5},
		{v["lock"], v["lock-bg"], "the “Locked” tag", 4.5},
		{v["ink"], v["lock-bg"], "a locked meeting's text", 4.5},
		{white, v["lock"], "a chosen locked meeting", 4.5},
		{focus, v["paper"], "focus outline (SC 1.4.11)", 3},
		{focus, white, "focus outline on a button (SC 1.4.11)", 3},
		{v["lock"], v["lock-bg"], "a locked meeting's double border (SC 1.4.11)", 3},
	} {
		t.Run(c.what, func(t *testing.T) {
			r := contrast(t, c.fg, c.bg)
			assert.GreaterOrEqual(t, r, c.min, "%s on %s: %s", c.fg, c.bg, fmt.Sprintf("%.2f:1", r))
		})
	}
}

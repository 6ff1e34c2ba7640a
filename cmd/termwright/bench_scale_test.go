package main

import (
	"encoding/json"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestScaleCommand(t *testing.T) {
	e, stdout, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"scale", "--sections", "20,30", "--time-limit", "0", "--json"}, e), "stderr: %s", stderr)
	lines := strings.Split(strings.TrimSpace(stdout.String()), "\n")
	require.Len(t, lines, 2)
	for i, n := range []int{20, 30} {
		var row scaleRow
		require.NoError(t, json.Unmarshal([]byte(lines[i]), &row))
		assert.Equal(t, n, row.Sections)
		assert.Equal(t, "satisfiable", row.FirstStatus)
		assert.Positive(t, row.Atoms)
		assert.Positive(t, row.Rules)
		assert.Empty(t, row.Cost, "no optimisation with --time-limit 0")
		assert.Empty(t, row.Error)
	}
	assert.Contains(t, stderr.String(), "scale: 20 sections")

	// Optimising, in a table, with two searches.
	e, stdout, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"scale", "--sections", "15", "--time-limit", "2s", "--threads", "2"}, e), "stderr: %s", stderr)
	out := stdout.String()
	assert.True(t, strings.HasPrefix(out, "sections "), out)
	assert.Contains(t, out, "\n15 ")

	for _, bad := range [][]string{{"--sections", "0"}, {"--sections", "x"}, {"--threads", "0"}} {
		e, _, stderr = solveEnv()
		assert.Equal(t, exitError, run(append([]string{"scale"}, bad...), e), bad)
		assert.NotEmpty(t, stderr.String())
	}
}

package main

import (
	"errors"
	"os"
	"strings"
	"testing"
)

// TestREADMEOutputs checks that the outputs quoted in README.md are what
// the command prints today: every code-block line "$ foldbound …" is run
// and its output compared with the lines that follow it. Blocks that
// shorten the output (a line "…"), talk to a server (--addr, serve), or
// print wall times (--verify) are left out.
func TestREADMEOutputs(t *testing.T) {
	text, err := os.ReadFile("../../README.md")
	if err != nil {
		t.Fatal(err)
	}
	lines := strings.Split(string(text), "\n")
	inCode, checked := false, 0
	for i := 0; i < len(lines); i++ {
		l := lines[i]
		if strings.HasPrefix(l, "```") {
			inCode = !inCode
			continue
		}
		if !inCode || !strings.HasPrefix(l, "$ foldbound ") {
			continue
		}
		cmd := strings.TrimPrefix(l, "$ foldbound ")
		for strings.HasSuffix(cmd, "\\") && i+1 < len(lines) {
			i++
			cmd = strings.TrimSuffix(cmd, "\\") + " " + strings.TrimSpace(lines[i])
		}
		j := i + 1
		for j < len(lines) && !strings.HasPrefix(lines[j], "$ ") && !strings.HasPrefix(lines[j], "```") {
			j++
		}
		want := strings.TrimRight(strings.Join(lines[i+1:j], "\n"), "\n ")
		i = j - 1
		if shortened(want) || strings.Contains(cmd, "--addr") ||
			strings.HasPrefix(cmd, "serve") || strings.Contains(cmd, "--verify") {
			continue
		}
		args, err := splitShell(cmd)
		if err != nil {
			t.Errorf("README line %q: %v", l, err)
			continue
		}
		out, errOut, code := runCLI(t, args...)
		got := strings.TrimRight(out+errOut, "\n ")
		if code != 0 || got != want {
			t.Errorf("README: foldbound %s\nprints (exit %d):\n%s\nREADME shows:\n%s", cmd, code, got, want)
		}
		checked++
	}
	t.Logf("%d README commands checked", checked)
	if checked < 5 {
		t.Errorf("checked %d README commands, want at least 5", checked)
	}
}

// shortened reports whether a quoted output leaves lines out (a line that
// is only "…", however indented).
func shortened(out string) bool {
	for _, l := range strings.Split(out, "\n") {
		if strings.TrimSpace(l) == "…" {
			return true
		}
	}
	return false
}

// splitShell splits a command line into words the way a POSIX shell does
// for the quoting the README uses: spaces separate words, single quotes
// keep their content literally.
func splitShell(s string) ([]string, error) {
	var words []string
	var cur strings.Builder
	inWord, quoted := false, false
	for _, r := range s {
		switch {
		case quoted && r == '\'':
			quoted = false
		case quoted:
			cur.WriteRune(r)
		case r == '\'':
			quoted, inWord = true, true
		case r == ' ' || r == '\t':
			if inWord {
				words = append(words, cur.String())
				cur.Reset()
				inWord = false
			}
		default:
			cur.WriteRune(r)
			inWord = true
		}
	}
	if quoted {
		return nil, errUnterminatedQuote
	}
	if inWord {
		words = append(words, cur.String())
	}
	return words, nil
}

var errUnterminatedQuote = errors.New("unterminated single quote")

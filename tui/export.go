package tui

import (
	"strings"

	"github.com/charmbracelet/bubbles/key"
	tea "github.com/charmbracelet/bubbletea"
)

// exportWhat is what an export writes.
type exportWhat int

const (
	exportMarkdown exportWhat = iota // the trail as Markdown
	exportText                       // the trail as plain text
	exportSheet                      // the session as a worksheet
	exportRecord                     // the job record, one HTML file
	exportCSV                        // the tables and results as CSV
)

// exportChoice is one entry of the export chooser: its key, its name in
// the chooser's offer, the question asked for the file and the file
// offered ("" offers the worksheet in use).
type exportChoice struct {
	key   key.Binding
	name  string
	title string
	file  string
	what  exportWhat
}

// exportChoices is the chooser's table of entries, in the order shown.
func exportChoices(k ExportKeys) []exportChoice {
	return []exportChoice{
		{k.Markdown, "Markdown", "export the trail as Markdown", "argand-trail.md", exportMarkdown},
		{k.Text, "text", "export the trail as plain text", "argand-trail.txt", exportText},
		{k.Sheet, "worksheet", "save the session as a worksheet (argand run FILE replays it)", "", exportSheet},
		{k.HTML, "record", "write a job record (HTML: steps, diagrams, checks, the worksheet)", "argand-record.html", exportRecord},
		{k.CSV, "CSV", "export the tables and results as CSV (as argand run --csv)", "argand-trail.csv", exportCSV},
	}
}

// exportMenu chooses what to export. It is a component: Update returns
// exportMsg with the entry chosen, or closeMsg; View is the line of
// choices.
type exportMenu struct {
	keys    ExportKeys
	th      theme
	choices []exportChoice
}

// exportMsg is the entry chosen.
type exportMsg struct{ choice exportChoice }

func newExportMenu(km KeyMap, th theme) exportMenu {
	return exportMenu{keys: km.Export, th: th, choices: exportChoices(km.Export)}
}

// Update takes the choice.
func (x exportMenu) Update(msg tea.Msg) (exportMenu, tea.Msg) {
	k, ok := msg.(tea.KeyMsg)
	if !ok {
		return x, nil
	}
	for _, c := range x.choices {
		if key.Matches(k, c.key) {
			return x, exportMsg{choice: c}
		}
	}
	if key.Matches(k, x.keys.Cancel) {
		return x, closeMsg{}
	}
	return x, nil
}

// View is the line of choices, from the bindings.
func (x exportMenu) View() string { return x.th.hint(x.keys.ShortHelp()) }

// Offer is the message shown when the chooser opens: each entry's key and
// what it writes.
func (x exportMenu) Offer() string {
	parts := make([]string, len(x.choices))
	for i, c := range x.choices {
		parts[i] = c.key.Help().Key + " " + c.name
	}
	return "export: " + strings.Join(parts, ", ")
}

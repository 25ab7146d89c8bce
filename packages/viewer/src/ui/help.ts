/** The keyboard help: every shortcut of the page, in one list the help panel shows. */
export const SHORTCUTS: readonly { keys: string; what: string }[] = [
  { keys: "Ctrl+Enter", what: "Run the document up to the selected cell (every run starts at the top, as conebook verify does)" },
  { keys: "Shift+Enter", what: "Run from the selected cell to the end" },
  { keys: "Ctrl+Shift+Enter", what: "Run the whole document" },
  { keys: "Ctrl+.", what: "Stop the run (the kernel worker is replaced by a fresh one)" },
  { keys: "Ctrl+S", what: "Save (records the outputs too when the last run covered the whole document as it is and every cell ran)" },
  { keys: "Ctrl+Z / Ctrl+Shift+Z or Ctrl+Y", what: "Undo / redo, across all cells" },
  { keys: "Enter (on a cell)", what: "Edit the cell" },
  { keys: "Escape (in an editor)", what: "Leave the editor; the cell stays selected" },
  { keys: "Arrow Up / Down (on a cell)", what: "Select the previous / next cell" },
  { keys: "Alt+Shift+Up / Down", what: "Move the selected cell up / down" },
  { keys: "Alt+Shift+N", what: "Add a code cell below the selected cell" },
  { keys: "Alt+Shift+K", what: "Change the kind of the selected cell (text, code, data, chart in turn)" },
  { keys: "Alt+Shift+Delete", what: "Delete the selected cell (undo brings it back)" },
  { keys: "Ctrl+Space (in code)", what: "Complete a name of aq, charts, show or control, with units and a line of documentation" },
  { keys: "Tab / Shift+Tab", what: "Move between controls (inside an editor Tab indents; press Escape first to leave it)" },
  { keys: "F1 or Ctrl+/", what: "Show or hide this list" },
];

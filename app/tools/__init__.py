"""Canvas tools: interaction objects that turn mouse and key input into previews and edits."""

"""The command line: argument parsing and verbs that call the core."""

"""The screens of the terminal UI, each with its .tcss beside it."""

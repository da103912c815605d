"""Reading and writing workspace files."""

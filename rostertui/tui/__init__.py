"""The terminal UI (Textual). The core never imports it; it only calls the core."""

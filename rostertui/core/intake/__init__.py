"""Staff and requests from the CSV files spreadsheets and form tools save (pure)."""

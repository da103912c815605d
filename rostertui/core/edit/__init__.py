"""Editing a workspace by hand, shared by the CLI and the UI. Pure: no textual.

* session.py   the editing session: roster and requests, their check and statistics,
               undo/redo, save and publish
* plans.py     swaps and absences planned before anything changes: swap -> check -> impact
* rosters.py   rows of people kept, cells two rosters differ in
* files.py     changing workspace files: tried on a scratch copy with the loader, then written
* forms.py     text in a form <-> a file model's fields; dates typed in a form
* view.py      what the grid and the status line show, derived from a session
"""

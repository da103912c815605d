"""Changing a published roster: diff, swap, absence, minimal-change repair.

* rows.py      a roster shaped to the unit: full rows in staff order
* diff.py      cells that differ between two rosters, by person and date
* impact.py    violations a change creates and resolves
* swap.py      exchange two cells (or two pairs)
* absence.py   a sick call or other absence recorded as leave; its shifts cleared
* repair.py    solve again with a cost per changed cell; the past kept as it was
* fixes.py     which resolved violation each changed cell answers
"""

"""Why no roster keeps every hard rule, and what a denied request would cost.

* reasons.py    a Reason: a sentence with the rules, people and dates it names
* words.py      plain words for rules, items, people and dates
* precheck.py   counting checks before any search (cover, hours, locks alone)
* conflict.py   a small set of hard items that cannot all hold (assumptions, then
                shrinking by deletion)
* gaps.py       where the cover would fall short if the other hard rules are kept
* requests.py   the cost of granting a request the roster denies
* run.py        `explain(ws)`: all of it, within a time budget
"""

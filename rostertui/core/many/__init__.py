"""Many workspaces solved at once on a cluster (`rostertui solve-many`).

* files.py    which folders are workspaces; a workspace's files as data, and back
* task.py     one unit's solve as a pure function of its files (what a worker runs)
* units.py    each unit's state as the client sees it; the news workers send
* write.py    the client's referee and its compare-and-refuse write of roster.toml
* client.py   the run: send, take results as they come, referee, write
* cluster.py  the Dask adapter, the only module importing dask (an optional extra)
"""

"""Fatigue: S-N curves (:mod:`.sn_curves`), rainflow counting (:mod:`.rainflow`), spectral
methods (:mod:`.spectral`) and Palmgren-Miner damage (:mod:`.miner`)."""

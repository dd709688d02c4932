"""Transmissibility of isolators (:mod:`.transmissibility`) and damping models and
defaults (:mod:`.damping`)."""

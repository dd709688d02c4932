"""Bolted joints: thread tables (:mod:`.threads`), bolt materials (:mod:`.bolt_materials`)
and the preload, resilience and safety relations of VDI 2230 (:mod:`.preload`)."""

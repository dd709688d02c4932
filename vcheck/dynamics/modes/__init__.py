"""Natural frequencies and mode shapes: one degree of freedom (:mod:`.sdof`), beams
(:mod:`.beams`), lumped mass-spring models (:mod:`.lumped`) and a rigid machine on
resilient mounts with its forced response (:mod:`.rigid_mounts`)."""

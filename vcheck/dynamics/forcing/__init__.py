"""What a machine puts out: forcing frequencies by source (:mod:`.excitations`) and the
unbalance force of a balance grade (:mod:`.unbalance`)."""

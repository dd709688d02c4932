"""The input side: TOML design files with source positions, units, validated models."""

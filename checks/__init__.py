"""Code checks, findings, writers (BCF, JSON, HTML, CSV), the pipeline and the CLI."""

"""Rules of AWC SDPWS-2015: shear wall aspect ratio limits and factor (§4.3.4)."""

from __future__ import annotations

from checks.rules.sdpws_2015.aspect_ratio import (
    aspect_factor,
    aspect_ratio_limit,
    check_aspect_ratio,
)

__all__ = ["aspect_factor", "aspect_ratio_limit", "check_aspect_ratio"]

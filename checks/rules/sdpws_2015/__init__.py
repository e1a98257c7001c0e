"""Rules of AWC SDPWS-2015: shear wall aspect ratio (§4.3.4), diaphragm aspect ratio
(§4.2.4).
"""

from __future__ import annotations

from checks.rules.sdpws_2015.aspect_ratio import (
    aspect_factor,
    aspect_ratio_limit,
    check_aspect_ratio,
)
from checks.rules.sdpws_2015.diaphragm_aspect_ratio import check_diaphragm_aspect_ratio

__all__ = [
    "aspect_factor",
    "aspect_ratio_limit",
    "check_aspect_ratio",
    "check_diaphragm_aspect_ratio",
]

"""What another BCF tool (the design team's) does to our file, done with bcf-client.

The calls follow the round-trip script of LIBRARY-NOTES §1.2 (add_reply): load, add a
comment or a topic with its own viewpoint, save.
"""

from __future__ import annotations

import io
import uuid
import zipfile

import bcf.bcfxml
import bcf.v2.model as m2
import bcf.v3.model as m3
import numpy as np
from PIL import Image
from xsdata.models.datatype import XmlDateTime

from tests.checks.report._tiny_model import ARCHITECT, LATER, gid

FOREIGN_TOPIC = "0f0e0d0c-0b0a-4909-8807-060504030201"
FOREIGN_COMMENT = "11111111-2222-4333-8444-555555555555"
REPLY = "22222222-3333-4444-8555-666666666666"
SKETCH = b"%PDF-1.4 sketch of the revised stair\n"


def _png() -> bytes:
    out = io.BytesIO()
    Image.new("RGB", (4, 3), (0, 128, 255)).save(out, format="PNG")
    return out.getvalue()


FOREIGN_PNG = _png()


def _date() -> XmlDateTime:
    return XmlDateTime.from_datetime(LATER)


def add_reply(
    path_in,
    path_out,
    topic_guid: str,
    text: str,
    *,
    new_status: str | None = None,
    guid: str = REPLY,
) -> None:
    """The architect replies to one of our topics (and may change its status)."""
    b = bcf.bcfxml.load(path_in)
    mdl = m3 if b.version.version_id == "3.0" else m2
    th = b.topics[topic_guid]
    th.comments = [
        *th.comments,
        mdl.Comment(guid=guid, date=_date(), author=ARCHITECT, comment=text),
    ]
    if new_status:
        th.topic.topic_status = new_status
        th.topic.modified_date = _date()
        th.topic.modified_author = ARCHITECT
    b.save(path_out)
    b.close()


def add_foreign_topic(path) -> None:
    """The architect adds a topic of their own: a viewpoint, a snapshot, a comment."""
    b = bcf.bcfxml.load(path)
    version = b.version.version_id
    mdl = m3 if version == "3.0" else m2
    th = b.add_topic(
        "Stair moved",
        "We moved the stair 1 m east.",
        ARCHITECT,
        topic_type="Request",
        topic_status="Open",
    )
    th.topic.creation_date = _date()
    # bcf-client's add_topic uses a random GUID; use a fixed one (folder = GUID, bug 5)
    b.topics.pop(th.guid)
    th.topic.guid = FOREIGN_TOPIC
    th._topic_dir = type(th._topic_dir)(FOREIGN_TOPIC)
    b.topics[FOREIGN_TOPIC] = th
    vh = th.add_viewpoint_from_point_and_guids(np.array([3.0, 3.0, 3.0]), gid("slab2"))
    vh.visualization_info.guid = "33333333-4444-4555-8666-777777777777"
    refs = th.topic.viewpoints.view_point if version == "3.0" else th.markup.viewpoints
    ref = refs[0]
    name = "stair.bcfv"
    th.viewpoints[name] = th.viewpoints.pop(ref.viewpoint)
    ref.viewpoint, ref.guid, ref.snapshot = name, vh.guid, "stair.png"
    vh.snapshot = FOREIGN_PNG
    th.comments = [
        mdl.Comment(
            guid=FOREIGN_COMMENT,
            date=_date(),
            author=ARCHITECT,
            comment="See the sketch.",
            viewpoint=mdl.CommentViewpoint(guid=vh.guid),
        )
    ]
    b.save(path)
    b.close()


def add_loose_file(path, member: str, data: bytes = SKETCH) -> None:
    """Add a file no markup refers to (a tool's own attachment)."""
    with zipfile.ZipFile(path, "a") as z:
        z.writestr(member, data)


def new_guid() -> str:
    """A fixed GUID for tests that need one more."""
    return str(uuid.UUID(int=0x44444444555546668777888888888888))

"""A strict-enough HTML reader for the tests (standard library ``html.parser``): the tags,
attributes and text of a document, and whether its elements nest properly."""

from __future__ import annotations

from dataclasses import dataclass, field
from html.parser import HTMLParser

VOID = {"area", "base", "br", "col", "embed", "hr", "img", "input", "link", "meta", "source",
        "track", "wbr"}
SVG_SELF_CLOSING_OK = True


@dataclass
class Document:
    tags: list[tuple[str, dict[str, str | None]]] = field(default_factory=list)
    text: list[str] = field(default_factory=list)
    style: list[str] = field(default_factory=list)
    errors: list[str] = field(default_factory=list)


class _Reader(HTMLParser):
    def __init__(self) -> None:
        super().__init__(convert_charrefs=True)
        self.doc = Document()
        self.stack: list[str] = []

    def handle_starttag(self, tag: str, attrs: list[tuple[str, str | None]]) -> None:
        self.doc.tags.append((tag, dict(attrs)))
        if tag not in VOID:
            self.stack.append(tag)

    def handle_startendtag(self, tag: str, attrs: list[tuple[str, str | None]]) -> None:
        self.doc.tags.append((tag, dict(attrs)))  # <line/> in SVG: no end tag expected

    def handle_endtag(self, tag: str) -> None:
        if tag in VOID:
            return
        if not self.stack or self.stack[-1] != tag:
            self.doc.errors.append(f"</{tag}> closes <{self.stack[-1] if self.stack else '-'}>")
            if tag in self.stack:
                while self.stack and self.stack.pop() != tag:
                    pass
            return
        self.stack.pop()

    def handle_data(self, data: str) -> None:
        if self.stack and self.stack[-1] == "style":
            self.doc.style.append(data)
        else:
            self.doc.text.append(data)


def read(html: str) -> Document:
    r = _Reader()
    r.feed(html)
    r.close()
    if r.stack:
        r.doc.errors.append(f"unclosed: {r.stack}")
    return r.doc

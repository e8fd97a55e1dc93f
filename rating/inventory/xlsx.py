"""The cached cell values of an .xlsx workbook, read straight from its package parts.

This is the fast reader behind :func:`rating.inventory.book.open_book`. It gives exactly what
the reference reader (openpyxl, read-only, cached values, plus one scan for merged cells and
formulas whose result was never saved) gives, in one pass over each wanted sheet, or it raises
(:class:`Unsupported`, or the error of a damaged part) and leaves the workbook to the reference
reader. What keeps the two equal: whatever this module does not fully understand, it refuses.

- The workbook part (sheets, 1900/1904 date system, names), its relationships and the
  document properties are read by openpyxl's own parsers, as the reference reader reads them.
  Names defined for one sheet (print titles, print areas, filter ranges a spreadsheet program
  adds on saving) are bound as openpyxl binds them to its sheets; the rating uses no name.
- Every part openpyxl reads when it opens a workbook (content types, shared strings,
  workbook, relationships, properties, theme, styles, every worksheet and its relationships)
  is read and checked here too, so a damaged part (bad zip checksum, XML that is not
  well-formed, a missing part) sends the workbook to the reference reader, which refuses it or
  reports the sheet exactly as before. (Of a sheet it does not read, openpyxl parses only
  what comes before the end of its dimension: see :meth:`Package.check_unread`.)
- From the stylesheet, only what decides a cell's value is read: which cell styles show a
  date, a time or a duration, derived as openpyxl derives them.
- Worksheets and the shared strings are read only in the plain form spreadsheet programs
  write: UTF-8; SpreadsheetML main as the one default namespace; no comments, CDATA sections,
  processing instructions or document type declaration; rows and cells with their ``r``
  reference, in order; cell content limited to ``<f>``, ``<v>`` and a plain inline
  ``<is><t>``. Everything around the rows (or the strings) is checked by expat (namespaces
  processed as ElementTree processes them; any document type declaration refused, so no
  entity can be declared, expanded or fetched from outside). The rows themselves are matched
  by regular expressions that accept only well-formed XML of that form (XML characters,
  balanced tags, attributes once each, entity references limited to the five predefined ones
  and character references to XML characters, attribute prefixes declared on the root).
- Values follow openpyxl's read-only cell rules (worksheet/_reader.py ``parse_cell``):
  numbers, shared and inline strings, booleans, errors, ISO dates, and numbers under a date or
  duration format converted by openpyxl's own :func:`~openpyxl.utils.datetime.from_excel` in
  the workbook's date system.

Not repeated here: openpyxl's object-model checks of content the reader never uses (fonts,
fills and borders of the stylesheet; the view, column widths, print settings, data
validations and conditional formats of a sheet). A workbook whose only defect is an invalid
value there (spreadsheet programs do not write one; some generators do, e.g. a font family
above 14) is read here, where the reference reader refused the workbook or the sheet.
"""

from __future__ import annotations

import datetime as dt
import io
import re
import struct
import zipfile
import zlib
from dataclasses import dataclass
from pathlib import Path
from xml.parsers import expat

from openpyxl.packaging.core import DocumentProperties
from openpyxl.packaging.custom import CustomPropertyList
from openpyxl.packaging.relationship import get_dependents, get_rels_path
from openpyxl.packaging.workbook import WorkbookPackage
from openpyxl.reader.strings import read_string_table
from openpyxl.styles.numbers import BUILTIN_FORMATS, is_date_format, is_timedelta_format
from openpyxl.utils.cell import range_boundaries
from openpyxl.utils.datetime import MAC_EPOCH, WINDOWS_EPOCH, from_excel, from_ISO8601
from openpyxl.workbook.defined_name import DefinedNameList
from openpyxl.worksheet.merge import MergeCell
from openpyxl.worksheet.print_settings import PrintArea, PrintTitles
from openpyxl.xml.constants import (
    ARC_CONTENT_TYPES,
    ARC_CORE,
    ARC_CUSTOM,
    ARC_STYLE,
    ARC_THEME,
    SHARED_STRINGS,
    SHEET_MAIN_NS,
    XLSM,
    XLSX,
    XLTM,
    XLTX,
)
from openpyxl.xml.functions import fromstring  # defusedxml's, as openpyxl uses it

# the file names openpyxl opens (it refuses others, so the reference reader does)
SUPPORTED_SUFFIXES = (".xlsx", ".xlsm", ".xltx", ".xltm")


class Unsupported(Exception):  # noqa: N818 - a decision, not an error: the reference reads it
    """The workbook holds something this reader leaves to the reference reader."""


@dataclass(frozen=True)
class SheetCells:
    """One worksheet as the reference reader sees it before trimming.

    ``rows`` are the rows openpyxl's ``iter_rows(min_row=1, max_row=max_rows + 1,
    max_col=ncols, values_only=True)`` yields (each ``ncols`` wide, gaps as empty rows), up to
    the last one holding a value (blank rows after it are dropped in the grid anyway);
    ``uncached`` holds every formula cell without a saved result in the first ``max_rows``
    rows (any column); ``merges`` every merged range, in document order.
    """

    rows: tuple[tuple[object, ...], ...]
    uncached: dict[tuple[int, int], str]
    merges: tuple[str, ...]
    beyond: int | None = None  # the first row below those read (``max_rows + 1``) holding a
    # value in the columns read: a row that would otherwise be dropped without a word


@dataclass(frozen=True)
class _Plain:
    """A part in the plain form: its text, and its content ``text[start:end]`` (the rows of
    a worksheet, the strings of the string table) still to be matched."""

    data: bytes
    text: str
    prefixes: frozenset[str]  # attribute prefixes declared on the root (and "xml")
    start: int
    end: int
    tail: int  # after the content's closing tag


class PercentNumber(float):
    """A number whose cell is formatted as a percent: the spreadsheet shows it a hundred
    times larger (a cell typed "20%" holds 0.2 and shows 20%). It equals the stored value;
    a percent column reads what the cell shows (rating.inventory.cells.parse_number)."""

    __slots__ = ()


def is_percent_format(code: str | None) -> bool:
    """Whether a number format shows its number as a percent: a % outside quoted text and
    escapes (a date or duration format is never one here)."""
    if not code:
        return False
    plain = re.sub(r'"[^"]*"|\\.', "", code)
    return "%" in plain


@dataclass(frozen=True)
class Package:
    """The parts of one workbook this reader needs, read and checked."""

    sheet_names: tuple[str, ...]
    worksheets: tuple[_Plain, ...]  # one per sheet, in the order of the names
    strings: tuple[str, ...]
    date_styles: frozenset[int]
    duration_styles: frozenset[int]
    epoch: dt.datetime
    dimensioned: tuple[bool, ...]  # per sheet: a dimension before the rows
    percent_styles: frozenset[int] = frozenset()  # styles showing numbers as percents

    def cells(self, name: str, ncols: int, max_rows: int) -> SheetCells:
        """The cells of sheet ``name``, ``ncols`` columns wide (see :class:`SheetCells`);
        the first sheet of that name, as openpyxl finds it."""
        part = self.worksheets[self.sheet_names.index(name)]
        return _SheetReader(self, ncols, max_rows).read(part)

    def check_unread(self, read: set[str]) -> None:
        """Check every sheet not read through :meth:`cells` (``read`` names those that were)
        as openpyxl checks it on opening, where it parses the part up to the end of its
        dimension (or, with none, of its rows) and no further.

        A sheet with a dimension before its rows needs nothing more: everything up to the
        dimension is well-formed (the part outside the rows was parsed whole and has no
        document type declaration), and openpyxl reports what its parser finds further on
        only after the dimension, when it has stopped. Any other sheet is parsed whole (a
        stricter check than openpyxl's, to be sure)."""
        for k, (name, part) in enumerate(zip(self.sheet_names, self.worksheets, strict=True)):
            if (name not in read or self.sheet_names.index(name) != k) and not self.dimensioned[k]:
                _parser().Parse(part.data, True)


# --- XML: the safe parser, the plain form ----------------------------------------------------


def _refuse_dtd(*_args: object) -> None:
    raise Unsupported("a document type declaration")


def _parser() -> expat.XMLParserType:
    """An expat parser (namespaces processed, as ElementTree does) that refuses any DTD."""
    parser = expat.ParserCreate(namespace_separator="}")
    parser.StartDoctypeDeclHandler = _refuse_dtd
    parser.EntityDeclHandler = _refuse_dtd
    parser.UnparsedEntityDeclHandler = _refuse_dtd
    parser.ExternalEntityRefHandler = _refuse_dtd  # type: ignore[assignment]
    parser.SetParamEntityParsing(expat.XML_PARAM_ENTITY_PARSING_NEVER)
    return parser


_S = r"[ \t\r\n]"  # XML white space (not Python's \s)
_NCNAME = r"[A-Za-z_][A-Za-z0-9_.\-]*"
_ATTRS = rf"""(?:{_S}+{_NCNAME}(?::{_NCNAME})?{_S}*={_S}*(?:"[^"<]*"|'[^'<]*'))*"""
_ATTR = re.compile(rf"""{_S}+({_NCNAME}(?::{_NCNAME})?){_S}*={_S}*(?:"([^"<]*)"|'([^'<]*)')""")
_ENCODING = re.compile(rb"""^<\?xml[^>]*?\sencoding\s*=\s*["']([^"']*)["']""")
_ROOT = re.compile(rf"(?:<\?xml[^>]*\?>)?{_S}*<({_NCNAME})({_ATTRS}){_S}*>")
# Characters XML does not allow, in UTF-8 (which has no surrogates and nothing above
# U+10FFFF): the control bytes (never part of a longer sequence), U+FFFE and U+FFFF.
_CONTROL_BYTES = bytes(range(0x09)) + b"\x0b\x0c" + bytes(range(0x0e, 0x20))
_NOT_CHARACTERS = (b"\xef\xbf\xbe", b"\xef\xbf\xbf")
_BARE_AMPERSAND = re.compile(r"&(?!(?:lt|gt|amp|quot|apos|#[0-9]+|#x[0-9a-fA-F]+);)")
_CHAR_REFERENCE = re.compile(r"&#(?:([0-9]+)|x([0-9a-fA-F]+));")
_ATTR_PREFIX = re.compile(rf"{_S}({_NCNAME}):{_NCNAME}{_S}*=")


def _attrs(blob: str) -> dict[str, str]:
    """The attributes of a start tag (each once; plain values only)."""
    pairs = _ATTR.findall(blob)
    out: dict[str, str] = {}
    for name, dq, sq in pairs:
        value = dq or sq
        if "&" in value or "\t" in value or "\n" in value or "\r" in value:
            raise Unsupported("an attribute value with references or line breaks")
        out[name] = value
    if len(out) != len(pairs):
        raise Unsupported("an attribute given twice")
    return out


def _plain(data: bytes, root: str, content: str | None = None) -> _Plain:
    """``data`` as a part in the plain form, whose root ``root`` holds ``<content>`` (or
    whose root is the content, when ``content`` is None).

    Checked here: the encoding; the root in the main namespace; no namespace declared
    before ``<content>`` except on the root (so the content is in the main namespace and its
    attribute prefixes are those of the root); no comment, CDATA section, processing
    instruction or DTD; everything but the inside of ``<content>`` well-formed (expat). The
    inside is checked by :func:`_check_content` and the matching.
    """
    body = data[3:] if data.startswith(b"\xef\xbb\xbf") else data
    enc = _ENCODING.match(body)
    if enc and enc.group(1).lower() != b"utf-8":
        raise Unsupported("an encoding other than UTF-8")
    text = body.decode("utf-8")
    m = _ROOT.match(text)
    if not m or m.group(1) != root:
        raise Unsupported(f"the root is not a plain <{root}>")
    attrs = _attrs(m.group(2))
    if attrs.get("xmlns") != SHEET_MAIN_NS:
        raise Unsupported("another default namespace")
    declared = {k[6:]: v for k, v in attrs.items() if k.startswith("xmlns:")}
    if len(set(declared.values())) != len(declared):
        raise Unsupported("two prefixes for one namespace")
    if content is None:
        start, end = m.end(), text.rfind(f"</{root}>")
        tail = end
    else:
        i = text.find(f"<{content}", m.end())
        o = re.compile(rf"<{content}{_S}*(/?)>").match(text, i) if i >= 0 else None
        if o is None:
            raise Unsupported(f"no plain <{content}>")
        start = end = tail = o.end()
        if not o.group(1):
            end = text.find(f"</{content}>", start)
            tail = end + len(content) + 3
    if end < start:
        raise Unsupported("no end of the content")
    # the inside of the content is matched element by element (nothing else passes there)
    head, rest = text[:start], text[tail:]
    if "<!" in head or "<!" in rest or head.find("<?", 1) >= 0 or "<?" in rest:
        raise Unsupported("comments, CDATA, processing instructions or a DTD")
    if content is not None and (f"<{content}" in rest or f":{content}" in head
                                or f":{content}" in rest):
        raise Unsupported(f"a second <{content}>")
    if "xmlns" in head[m.end():]:  # on an element around the content (or beside it)
        raise Unsupported("a namespace declared inside the part")
    _parser().Parse((text[:start] + text[end:]).encode("utf-8"), True)
    return _Plain(data, text, frozenset(declared) | {"xml"}, start, end, tail)


def _check_content(part: _Plain) -> None:
    """What the matching leaves to check for the inside of the content to be well-formed:
    XML characters only, ``&`` only in a predefined entity or a character reference to an
    XML character, no ``]]>``, no namespace declaration. (Attribute prefixes are checked
    where the attributes are read.)"""
    inside = part.text[part.start:part.end]
    data = part.data  # the whole part: what expat checked is free of these too
    if (len(data.translate(None, _CONTROL_BYTES)) != len(data)
            or any(c in data for c in _NOT_CHARACTERS)):
        raise Unsupported("characters XML does not allow")
    if "]]>" in inside or "xmlns" in inside:
        raise Unsupported("a CDATA end or a namespace declaration among the rows")
    if "&" in inside:
        if _BARE_AMPERSAND.search(inside):
            raise Unsupported("an undeclared entity")
        for m in _CHAR_REFERENCE.finditer(inside):
            code = int(m.group(1)) if m.group(1) else int(m.group(2), 16)
            if not (code in (0x9, 0xA, 0xD) or 0x20 <= code <= 0xD7FF
                    or 0xE000 <= code <= 0xFFFD or 0x10000 <= code <= 0x10FFFF):
                raise Unsupported("a reference to a character XML does not allow")


_NAMED = {"lt": "<", "gt": ">", "amp": "&", "quot": '"', "apos": "'"}
_REFERENCE = re.compile(r"&(?:#([0-9]+)|#x([0-9a-fA-F]+)|(lt|gt|amp|quot|apos));")


def _reference(m: re.Match[str]) -> str:
    if m.group(1):
        return chr(int(m.group(1)))
    if m.group(2):
        return chr(int(m.group(2), 16))
    return _NAMED[m.group(3)]


def _content(raw: str) -> str:
    """Character data as an XML parser reports it: line ends normalised, then references
    resolved (a ``&#13;`` stays a carriage return)."""
    if "\r" in raw:
        raw = raw.replace("\r\n", "\n").replace("\r", "\n")
    if "&" in raw:
        raw = _REFERENCE.sub(_reference, raw)
    return raw


def _elements(data: bytes, levels: int = 1) -> list[tuple[int, str, dict[str, str]]]:
    """The elements of a small part down to ``levels`` below the root, in document order:
    (level, local name, attributes), attributes in a namespace left out as openpyxl leaves
    them out (the root is level 0)."""
    out: list[tuple[int, str, dict[str, str]]] = []
    depth = 0

    def start(name: str, attrs: dict[str, str]) -> None:
        nonlocal depth
        if depth <= levels:
            plain = {k: v for k, v in attrs.items() if "}" not in k}
            out.append((depth, name.rsplit("}", 1)[-1], plain))
        depth += 1

    def end(_name: str) -> None:
        nonlocal depth
        depth -= 1

    parser = _parser()
    parser.StartElementHandler = start
    parser.EndElementHandler = end
    parser.Parse(data, True)
    return out


def _children(data: bytes) -> tuple[dict[str, str], list[tuple[str, dict[str, str]]]]:
    """The root's attributes and its children (local name, attributes)."""
    elements = _elements(data)
    return elements[0][2], [(tag, attrs) for _, tag, attrs in elements[1:]]


# --- the package -----------------------------------------------------------------------------


class _Members:
    """The members of an open package, read as ``ZipFile.read`` reads them, from the bytes of
    the file read once: a member stored or deflated in the usual way is taken from them and
    checked as ``zipfile`` checks it (its local header and name, its length, its CRC-32);
    any other member, or one failing a check, is read by ``ZipFile.read`` itself (which reads
    it or raises as before)."""

    def __init__(self, z: zipfile.ZipFile) -> None:
        self.z = z
        self.data = b""
        if isinstance(z.filename, str) and z.fp is not None:
            with open(z.filename, "rb") as f:
                self.data = f.read()

    def read(self, name: str) -> bytes:
        got = self.direct(self.z.getinfo(name))
        return self.z.read(name) if got is None else got

    def direct(self, info: zipfile.ZipInfo) -> bytes | None:
        """The member ``info`` from the file's bytes; None unless it is plain and sound."""
        if (info.flag_bits & 0x61  # encrypted, patched, strong encryption
                or info.compress_type not in (zipfile.ZIP_STORED, zipfile.ZIP_DEFLATED)):
            return None
        data, at = self.data, info.header_offset
        header = data[at:at + _LOCAL_HEADER.size]
        if len(header) != _LOCAL_HEADER.size:
            return None
        magic, flags, name_length, extra_length = _LOCAL_HEADER.unpack(header)
        if magic != b"PK\x03\x04":
            return None
        at += _LOCAL_HEADER.size
        try:
            name = data[at:at + name_length].decode(
                "utf-8" if flags & 0x800 else self.z.metadata_encoding or "cp437")
        except UnicodeDecodeError:
            return None
        if name != info.orig_filename:
            return None
        at += name_length + extra_length
        raw = data[at:at + info.compress_size]
        if len(raw) != info.compress_size:
            return None
        if info.compress_type == zipfile.ZIP_DEFLATED:
            inflate = zlib.decompressobj(-15)
            try:
                out = inflate.decompress(raw)
            except zlib.error:
                return None
            if not inflate.eof:
                return None
        else:
            out = raw
        if len(out) != info.file_size or zlib.crc32(out) != info.CRC:
            return None
        return out


# signature, flags, name length, extra field length of a local file header (zipfile's
# structFileHeader, the fields between them skipped)
_LOCAL_HEADER = struct.Struct("<4s2xH18xHH")


def read_package(z: zipfile.ZipFile, path: Path) -> Package:
    """Read from the open package ``z`` of ``path`` the parts the reader needs.

    Raises :class:`Unsupported` (or the error of a damaged part) when the reference reader
    must decide.
    """
    if path.suffix.lower() not in SUPPORTED_SUFFIXES:
        raise Unsupported("a file name openpyxl does not open")
    names = set(z.namelist())
    members = _Members(z)
    overrides = _content_types(members.read(ARC_CONTENT_TYPES))
    strings = _shared_strings(members, overrides)
    wb_part = _workbook_part(overrides)
    workbook = WorkbookPackage.from_tree(fromstring(members.read(wb_part)))
    if workbook.externalReferences:
        raise Unsupported("links to other workbooks")
    if ARC_CORE in names:
        DocumentProperties.from_tree(fromstring(members.read(ARC_CORE)))
    if ARC_CUSTOM in names:
        CustomPropertyList.from_tree(fromstring(members.read(ARC_CUSTOM)))
    if ARC_THEME in names:
        members.read(ARC_THEME)  # openpyxl reads it: a damaged theme part is noticed here too
    dates, durations, percents = (_date_styles(members.read(ARC_STYLE)) if ARC_STYLE in names
                                  else ((), (), ()))
    sheet_names: list[str] = []
    worksheets: list[_Plain] = []
    dimensioned: list[bool] = []
    rels = None
    for sheet in workbook.sheets:
        if not sheet.id:
            continue  # openpyxl drops such a sheet (with a warning)
        if rels is None:
            rels = get_dependents(z, get_rels_path(wb_part)).to_dict()
        rel = rels[sheet.id]
        if rel.target not in names:
            continue  # openpyxl drops a sheet whose part is missing
        if rel.Type is None or "chartsheet" in rel.Type:
            raise Unsupported("a chart sheet")
        rels_path = get_rels_path(rel.target)
        if rels_path in names:
            _check_relationships(members.read(rels_path))
        part = _plain(members.read(rel.target), "worksheet", "sheetData")
        dimensioned.append(_check_dimension(part))
        sheet_names.append(sheet.name)
        worksheets.append(part)
    if workbook.definedNames:
        _bind_sheet_names(workbook.definedNames, len(sheet_names))
    epoch = MAC_EPOCH if workbook.properties.date1904 else WINDOWS_EPOCH
    return Package(tuple(sheet_names), tuple(worksheets), strings, frozenset(dates),
                   frozenset(durations), epoch, tuple(dimensioned), frozenset(percents))


def _bind_sheet_names(names: DefinedNameList, sheets: int) -> None:
    """Names defined for one sheet, bound as openpyxl binds them when it opens the workbook
    (reader/workbook.py ``assign_names``; ``sheets`` counts the sheets it keeps, in order): a
    name for a sheet that is not there is passed over (openpyxl warns); print titles and print
    areas are read by openpyxl's own parsers (what fails there fails here; a print area
    openpyxl passes over with a warning is passed over); other names are kept by openpyxl or
    ignored, and need nothing. None of them changes a value read."""
    for idx, scoped in names.by_sheet().items():
        if idx == "global":
            continue
        try:
            range(sheets)[idx]  # openpyxl's list of sheets taken at this index
        except IndexError:
            continue
        for defn in scoped.values():
            reserved = defn.is_reserved
            if reserved == "Print_Titles":
                PrintTitles.from_string(defn.value)
            elif reserved == "Print_Area":
                try:
                    PrintArea.from_string(defn.value)
                except TypeError:
                    continue  # openpyxl warns and goes on


def _content_types(data: bytes) -> list[tuple[str, str]]:
    """The (part name, content type) overrides, when the manifest is one openpyxl reads as
    written (each entry with exactly its two attributes)."""
    root, children = _children(data)
    if root:
        raise Unsupported("attributes on the content types")
    overrides: list[tuple[str, str]] = []
    defaults = 0
    for tag, attrs in children:
        if tag == "Override":
            if set(attrs) != {"PartName", "ContentType"}:
                raise Unsupported("an unusual content type override")
            overrides.append((attrs["PartName"], attrs["ContentType"]))
        elif tag == "Default":
            if set(attrs) != {"Extension", "ContentType"}:
                raise Unsupported("an unusual default content type")
            defaults += 1
    if not overrides or not defaults:
        raise Unsupported("content types openpyxl completes with its own")
    return overrides


def _find(overrides: list[tuple[str, str]], content_type: str) -> str | None:
    return next((part for part, ct in overrides if ct == content_type), None)


def _workbook_part(overrides: list[tuple[str, str]]) -> str:
    """The workbook part, found as openpyxl finds it (template and macro types first)."""
    for content_type in (XLTM, XLTX, XLSM, XLSX):
        part = _find(overrides, content_type)
        if part:
            return part[1:]
    raise Unsupported("no workbook part among the overrides")


def _date_styles(data: bytes) -> tuple[set[int], set[int], set[int]]:
    """The cell styles (indexes into ``cellXfs``) whose number format shows a date or time,
    those showing a duration, derived as openpyxl derives them (Stylesheet
    ``_normalise_numbers``): a style's ``numFmtId`` names a custom ``numFmt`` of the sheet or
    else a built-in format, and openpyxl's own ``is_date_format`` and ``is_timedelta_format``
    judge the format code; and those showing a percent (:func:`is_percent_format`). The rest
    of the stylesheet is only checked to be well-formed."""
    custom: dict[int, str] = {}
    formats: list[int] | None = None
    lists = {"numFmts": 0, "cellXfs": 0}
    parent = ""
    for level, tag, attrs in _elements(data, levels=2):
        if level == 1:
            parent = tag
            if tag in lists:
                lists[tag] += 1
                if tag == "cellXfs":
                    formats = []
        elif level == 2 and parent == "numFmts" and tag == "numFmt":
            custom[int(attrs["numFmtId"])] = attrs["formatCode"]  # openpyxl needs both
        elif level == 2 and parent == "cellXfs" and tag == "xf":
            formats.append(int(attrs.get("numFmtId", 0)))  # type: ignore[union-attr]
    if max(lists.values()) > 1:
        raise Unsupported("a stylesheet with two lists of number or cell formats")
    dates: set[int] = set()
    durations: set[int] = set()
    percents: set[int] = set()
    for idx, fmt_id in enumerate(formats or ()):
        fmt = custom[fmt_id] if fmt_id in custom else BUILTIN_FORMATS.get(fmt_id)
        if is_date_format(fmt):
            dates.add(idx)
        elif is_percent_format(fmt):
            percents.add(idx)
        if is_timedelta_format(fmt):
            durations.add(idx)
    return dates, durations, percents


# A worksheet's relationships in the plain form programs write (attribute values without
# references or characters XML does not allow): well-formed by their form alone.
_REL_VALUE = '"[^"<&\x00-\x08\x0b\x0c\x0e-\x1f\ufffe\uffff]*+"'
_PLAIN_RELS = re.compile(
    rf'(?:<\?xml version="1\.0"(?: encoding="[Uu][Tt][Ff]-8")?(?: standalone="(?:yes|no)")?'
    rf'\?>)?{_S}*+<Relationships xmlns="http://schemas\.openxmlformats\.org/package/2006/'
    rf'relationships">((?:{_S}*+<Relationship(?:{_S}++(?:Id|Type|TargetMode|Target)='
    rf'{_REL_VALUE})++{_S}*+/>)*+){_S}*+</Relationships>{_S}*+')
_REL_ATTR = re.compile(rf"{_S}++(Id|Type|TargetMode|Target)={_REL_VALUE}|(/>)")


def _check_relationships(data: bytes) -> None:
    """A worksheet's relationships as openpyxl reads them: every one has a target."""
    try:
        plain = _PLAIN_RELS.fullmatch(data.decode("utf-8"))
    except UnicodeDecodeError:
        plain = None
    if plain is not None:  # each attribute once, a target in each
        names: set[str] = set()
        for name, close in _REL_ATTR.findall(plain.group(1)):
            if close:
                if "Target" not in names:
                    break
                names = set()
            elif name in names:
                break
            else:
                names.add(name)
        else:
            return
    _root, children = _children(data)
    for tag, attrs in children:
        if tag == "Relationship" and (not set(attrs) <= {"Id", "Type", "Target", "TargetMode"}
                                      or "Target" not in attrs):
            raise Unsupported("an unusual relationship")


def _shared_strings(members: _Members, overrides: list[tuple[str, str]]) -> tuple[str, ...]:
    """The shared strings, as openpyxl reads them (by its own reader unless plain)."""
    part = _find(overrides, SHARED_STRINGS)
    if part is None:
        return ()
    data = members.read(part[1:])
    try:
        return _plain_strings(data)
    except Unsupported:
        return tuple(read_string_table(io.BytesIO(data)))


_T = rf"<t{_ATTRS}{_S}*(?:/>|>([^<]*)</t>)"
_SI = re.compile(rf"{_S}*(?:<si>(?:{_T})?</si>|<si/>|<si>((?:<r>{_T}</r>)+)</si>)")
_RUN_TEXT = re.compile(_T)


def _plain_strings(data: bytes) -> tuple[str, ...]:
    """Plain strings (text, or runs of text without formatting), as openpyxl's reader gives
    them: the texts of a string joined, ``x005F_`` removed."""
    part = _plain(data, "sst")
    _check_content(part)
    text = part.text
    out: list[str] = []
    pos = part.start
    while (m := _SI.match(text, pos, part.end)) is not None:  # one string after the other
        pos = m.end()
        if m.group(2) is not None:
            s = "".join(_content(t) for t in _RUN_TEXT.findall(m.group(2)) if t)
        else:
            s = _content(m.group(1) or "")
        out.append(s.replace("x005F_", ""))
    if text[pos:part.end].strip(" \t\r\n"):
        raise Unsupported("something other than plain strings")
    return tuple(out)


# --- worksheets ------------------------------------------------------------------------------

_OUTSIDE = re.compile(r"<(?:[\w.\-]+:)?(?:row|c)[\s/>]|<[\w.\-]+:(?:mergeCell|dimension)[\s/>]")
_DIMENSION = re.compile(rf"<dimension({_ATTRS}){_S}*/?>")
_MERGE = re.compile(rf"<mergeCell({_ATTRS}){_S}*/?>")
_MERGES = re.compile(rf"<mergeCells({_ATTRS}){_S}*/?>")


def _check_dimension(part: _Plain) -> bool:
    """The sheet's dimension, which openpyxl reads on opening (a bad one fails there); no
    rows, cells, merges or dimensions in another namespace or outside the rows. True when
    the sheet has a dimension (before its rows)."""
    head, rest = part.text[:part.start], part.text[part.tail:]
    if _OUTSIDE.search(head) or _OUTSIDE.search(rest):
        raise Unsupported("rows or cells outside sheetData, or in another namespace")
    dims = _DIMENSION.findall(head)
    if len(dims) > 1:
        raise Unsupported("two dimensions")
    if dims:
        attrs = {k: v for k, v in _attrs(dims[0]).items() if ":" not in k}
        if set(attrs) != {"ref"}:
            raise Unsupported("an unusual dimension")
        range_boundaries(attrs["ref"])
    return bool(dims)


def col_number(letters: str) -> int:
    """The column number of column letters (A = 1)."""
    n = 0
    for ch in letters:
        n = n * 26 + ord(ch) - 64
    return n


# The plain form openpyxl and spreadsheet programs write: rows with r first, cells with r, s,
# t in that order holding nothing, a value or an inline string. Matched as a whole (a cell's
# row is its row's r, by the back reference), then read cell by cell. Every repetition is
# possessive: what follows it never starts with a character it takes, so giving some back
# could not help a match (the same texts match), and the matching keeps no way back.
_PLAIN_CELL = (rf'<c r="[A-Z]{{1,3}}+\1"(?: s="[0-9]++")?(?: t="[A-Za-z]++")?{_S}*+'
               rf'(?:/>|>(?:<v>[^<]*+</v>|<is><t(?: xml:space="preserve")?>[^<]*+</t></is>)?</c>)')
_ROW_ATTRS = (rf"""(?:{_S}++(?!r{_S}*=){_NCNAME}(?::{_NCNAME})?{_S}*+={_S}*+"""
              rf"""(?:"[^"<]*+"|'[^'<]*+'))*+""")
_PLAIN_ROWS = re.compile(rf'(?:{_S}*+<row r="([1-9][0-9]*+)"{_ROW_ATTRS}{_S}*+'
                         rf'(?:/>|>(?:{_S}*+{_PLAIN_CELL})*+{_S}*+</row>))*+{_S}*+')
_PLAIN_ROW_START = re.compile(rf'<row r="([1-9][0-9]*+)"({_ROW_ATTRS})')
_PLAIN_CELL_REF = re.compile(r'<c r="([A-Z]{1,3}+[1-9][0-9]*+)"')
# groups: column letters, row, s, t, the value, "<is>" for an inline string, its text
_VALUE_CELL = re.compile(r'<c r="([A-Z]{1,3}+)([1-9][0-9]*+)"(?: s="([0-9]++)")?'
                         r'(?: t="([A-Za-z]++)")?[ \t\r\n]*+>(?:<v>([^<]*+)</v>|'
                         r'(<is>)<t(?: xml:space="preserve")?>([^<]*+)</t></is>)</c>')
# Any other order or quoting of attributes, a formula, white space between the elements,
# one row or cell at a time. Groups: 1 the cell's attributes, 2 the formula element, 3 its
# text, 4 the value, 5 the inline string element, 6 its text; 7 a row's attributes, 8 "/" for
# an empty row; 9 the end of a row.
# (White space is matched once, after the element it follows, so that no run of it can be
# split in more than one way: a cell of many spaces and something else fails at once.)
_TOKEN = re.compile(
    rf"{_S}*(?:<c({_ATTRS}){_S}*(?:/>|>{_S}*"
    rf"(<f{_ATTRS}{_S}*(?:/>|>([^<]*)</f>){_S}*)?"
    rf"(?:(?:<v{_S}*/>|<v{_S}*>([^<]*)</v>){_S}*)?"
    rf"(<is{_S}*>{_S}*(?:<t{_ATTRS}{_S}*(?:/>|>([^<]*)</t>){_S}*)?</is>{_S}*|<is{_S}*/>{_S}*)?"
    rf"</c>)|<row({_ATTRS}){_S}*(/?)>|(</row>))")
_CELL_REF = re.compile(r"([A-Z]{1,3})([1-9][0-9]*)")
_ATTR_NAMES = re.compile(rf"{_S}+({_NCNAME}(?::{_NCNAME})?){_S}*=")


def _cast_number(text: str) -> int | float:
    """A number as openpyxl reads it: a float when it has a point or an exponent."""
    if "." in text or "E" in text or "e" in text:
        return float(text)
    return int(text)


class _SheetReader:
    """One pass over one worksheet's rows (a fresh instance per sheet; nothing is shared).

    The values of rows 1 to ``max_rows + 1`` and columns 1 to ``ncols`` are kept; every cell
    is converted all the same, so a value openpyxl cannot read sends the workbook to it.
    """

    def __init__(self, package: Package, ncols: int, max_rows: int) -> None:
        self.package = package
        self.ncols = ncols
        self.max_rows = max_rows
        self.columns: dict[str, int] = {}
        self.grid: dict[int, list[object]] = {}
        self.uncached: dict[tuple[int, int], str] = {}
        self.prefixes = frozenset[str]()
        self.beyond: int | None = None

    def read(self, part: _Plain) -> SheetCells:
        _check_content(part)
        self.prefixes = part.prefixes
        if not (_PLAIN_ROWS.fullmatch(part.text, part.start, part.end)
                and self.read_plain(part)):
            self.read_tokens(part)
        n = max(self.grid, default=0)
        empty = (None,) * self.ncols
        rows = tuple(tuple(self.grid[r]) if r in self.grid else empty for r in range(1, n + 1))
        return SheetCells(rows, self.uncached, self.merges(part), self.beyond)

    def check_row_attrs(self, blob: str) -> None:
        """Attributes once each, prefixes declared (what the matching cannot see)."""
        names = _ATTR_NAMES.findall(blob)
        if len(set(names)) != len(names) or any(
                ":" in n and n.split(":", 1)[0] not in self.prefixes for n in names):
            raise Unsupported("an attribute given twice, or an undeclared prefix")

    def read_plain(self, part: _Plain) -> bool:
        """Read rows matched as a whole, from the cells that hold something; False (nothing
        read) when a cell is given twice (the last one counts, even empty)."""
        refs = _PLAIN_CELL_REF.findall(part.text, part.start, part.end)
        if len(set(refs)) != len(refs):
            return False
        row, blobs = 0, set()
        for r, blob in _PLAIN_ROW_START.findall(part.text, part.start, part.end):
            if int(r) <= row:
                raise Unsupported("rows out of order")
            row = int(r)
            if blob and blob not in blobs:
                self.check_row_attrs(blob)
                blobs.add(blob)
        grid, ncols, last, columns = self.grid, self.ncols, self.max_rows + 1, self.columns
        value, dates = self.value, self.package.date_styles
        text, start, end = part.text, part.start, part.end
        # references or carriage returns anywhere among the rows: every text is resolved
        escaped = text.find("&", start, end) >= 0 or text.find("\r", start, end) >= 0
        percents = self.package.percent_styles
        plain: dict[str, bool] = {"": 0 not in dates and 0 not in percents}  # style -> its
        # numbers are plain (not dates, durations or percents)
        at, row, values, inside = "", 0, None, False  # the row of the cells met last
        for letters, digits, style, t, v, inline, inline_text in _VALUE_CELL.findall(
                text, start, end):
            if escaped:
                v, inline_text = _content(v), _content(inline_text)
            if t == "inlineStr":
                got: object = inline_text if inline else None
            elif not v:
                got = None
            elif not t or t == "n":
                number = plain.get(style)
                if number is None:
                    number = plain[style] = (int(style) not in dates
                                             and int(style) not in percents)
                if not number:
                    got = value("n", int(style) if style else 0, v, False, None)
                elif "." in v or "E" in v or "e" in v:  # as _cast_number
                    got = float(v)
                else:
                    got = int(v)
            else:
                got = value(t, int(style) if style else 0, v, False, None)
            if digits != at:  # a new row (its cells share its number, rows come in order)
                at = digits
                row = int(digits)
                inside = row <= last
                values = grid.get(row)
            col = columns.get(letters)
            if col is None:
                col = columns[letters] = col_number(letters)
            if inside and col <= ncols:
                if values is None:
                    if got is None:
                        continue
                    values = grid[row] = [None] * ncols
                values[col - 1] = got
            elif (got is not None and col <= ncols and self.beyond is None and not inside
                  and not (got.__class__ is str and not got.strip())):  # (a space: blank)
                self.beyond = row
        return True

    def read_tokens(self, part: _Plain) -> None:
        text, end = part.text, part.end
        pos, row, row_text, in_row = part.start, 0, "", False
        while pos < end:
            m = _TOKEN.match(text, pos, end)
            if m is None:
                if text[pos:end].strip(" \t\r\n"):
                    raise Unsupported("something other than plain rows and cells")
                break
            pos = m.end()
            if m.lastindex is not None and m.lastindex <= 6:
                if not in_row:
                    raise Unsupported("a cell outside a row")
                attrs = self.token_attrs(m.group(0), m.group(1))
                ref = _CELL_REF.fullmatch(attrs.get("r", ""))
                if not ref or ref.group(2) != row_text:
                    raise Unsupported("a cell without its row's reference")
                style, t = attrs.get("s"), attrs.get("t")
                v = _content(m.group(4)) if m.group(4) else None
                if m.group(2) is not None and v is None and row <= self.max_rows:
                    f = _content(m.group(3) or "").strip()
                    col = self.column(ref.group(1))
                    self.uncached[(row, col)] = "=" + f if f else "(a shared formula)"
                # no s is style 0 and an empty s none; no t is a number (openpyxl's defaults)
                self.put(row, ref.group(1), self.value(
                    "n" if t is None else t, 0 if style is None else int(style) if style else -1,
                    v, m.group(5) is not None, m.group(6)))
            elif m.lastindex == 8:
                if in_row:
                    raise Unsupported("a row inside a row")
                row_text = self.token_attrs(m.group(0), m.group(7)).get("r", "")
                if not (row_text.isascii() and row_text.isdigit()) or int(row_text) <= row:
                    raise Unsupported("rows without a plain number, or out of order")
                row, in_row = int(row_text), not m.group(8)
            else:
                if not in_row:
                    raise Unsupported("the end of a row that was not started")
                in_row = False
        if in_row:
            raise Unsupported("a row without its end")

    def token_attrs(self, token: str, blob: str) -> dict[str, str]:
        """The attributes ``blob`` of a row's or cell's start tag, when every attribute
        prefix in the whole ``token`` is declared on the root."""
        if not set(_ATTR_PREFIX.findall(token)) <= self.prefixes:
            raise Unsupported("an attribute prefix not declared on the root")
        return _attrs(blob)

    def column(self, letters: str) -> int:
        col = self.columns.get(letters)
        if col is None:
            col = self.columns[letters] = col_number(letters)
        return col

    def put(self, row: int, letters: str, value: object) -> None:
        """Keep ``value`` at (row, column ``letters``) when within the rows and columns read
        (the last cell of a place counts, as in openpyxl)."""
        col = self.column(letters)
        if value is not None and col <= self.ncols and row > self.max_rows + 1 \
                and self.beyond is None and not (isinstance(value, str) and not value.strip()):
            self.beyond = row
        if col <= self.ncols and row <= self.max_rows + 1:
            values = self.grid.get(row)
            if values is None:
                if value is None:
                    return
                values = self.grid[row] = [None] * self.ncols
            values[col - 1] = value

    def value(self, t: str, style: int, v: str | None, inline: bool,
              inline_text: str | None) -> object:
        """One cell's value, by openpyxl's read-only rules (worksheet/_reader.py parse_cell)."""
        if t == "inlineStr":
            return _content(inline_text or "") if inline else None
        if v is None:
            return None
        if t == "n":
            number = _cast_number(v)
            if style in self.package.date_styles:
                try:
                    return from_excel(number, self.package.epoch,
                                      timedelta=style in self.package.duration_styles)
                except (OverflowError, ValueError):
                    return "#VALUE!"  # as openpyxl: outside the limits for dates
            if style in self.package.percent_styles:
                return PercentNumber(number)
            return number
        if t == "s":
            return self.package.strings[int(v)]
        if t == "b":
            return bool(int(v))
        if t == "d":
            return from_ISO8601(v)
        return v

    @staticmethod
    def merges(part: _Plain) -> tuple[str, ...]:
        """Merged ranges (every ``mergeCell`` with a ref), checked as openpyxl reads them."""
        rest = part.text[:part.start] + part.text[part.tail:]
        for blob in _MERGES.findall(rest):
            attrs = _attrs(blob)
            if not set(attrs) <= {"count"} or not attrs.get("count", "0").isdigit():
                raise Unsupported("an unusual list of merged cells")
        refs: list[str] = []
        for blob in _MERGE.findall(rest):
            attrs = _attrs(blob)
            if set(attrs) != {"ref"}:
                raise Unsupported("an unusual merged range")
            MergeCell(attrs["ref"])  # openpyxl fails the sheet on a range it cannot read
            refs.append(attrs["ref"])
        return tuple(refs)

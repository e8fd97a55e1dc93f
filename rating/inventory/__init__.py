"""The inspection workbook: its layout (schema), the blank template, and the reader.

``read_workbook(path)`` returns a :class:`WorkbookReading` with the :class:`rating.model.Bridge`
and every problem found (``Sheet!Cell`` and a sentence); ``write_template(path)`` writes the
blank workbook.
"""

from rating.inventory.problems import Problem, WorkbookReading
from rating.inventory.reader import read_workbook
from rating.inventory.template import WorkbookContent, write_template, write_workbook

__all__ = ["Problem", "WorkbookContent", "WorkbookReading", "read_workbook", "write_template",
           "write_workbook"]

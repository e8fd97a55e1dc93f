"""The rating report: one self-contained HTML file with SVG drawings, for print."""

from rating.report.html import render_report

__all__ = ["render_report"]

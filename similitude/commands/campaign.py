"""``similitude campaign CAMPAIGN.toml``: plan a campaign of model tests from a campaign file.

Reads the campaign, ranks every candidate facility of every test, chooses the facilities and
the shared model scales, plans and books each test, prints a short summary (or the campaign as
JSON) and, when asked, writes the campaign workbook (``-o``). Nothing is written unless the
whole campaign reads and plans without a problem, and no existing file is replaced without
``--force``.
"""

from __future__ import annotations

import argparse
from dataclasses import replace
from pathlib import Path

from similitude.cautions import caution_line
from similitude.commands.common import (
    add_paper_option,
    check_targets,
    json_text,
    print_written,
    workbook_path,
)
from similitude.planning.campaign import CAMPAIGN_OBJECTIVES
from similitude.planning.campaign_plan import CampaignPlan, plan_campaign
from similitude.readers.campaign_file import load_campaign


def add_parser(sub) -> argparse.ArgumentParser:
    """Register the ``campaign`` command."""
    p = sub.add_parser(
        "campaign",
        help="plan a campaign of model tests: rank candidate facilities, share models, book",
        description="Read a TOML campaign file (several tests of one ship, the models they "
        "share, candidate facilities), rank the facilities of each test, choose them and the "
        "shared model scales, plan and book every test; print a summary and optionally write "
        "the campaign workbook. Nothing is written when the campaign has a problem.",
    )
    p.add_argument("campaign", metavar="CAMPAIGN.toml", help="the campaign file")
    p.add_argument("-o", "--output", metavar="CAMPAIGN.xlsx",
                   help="write the campaign workbook here (not written without this option)")
    p.add_argument("--force", action="store_true", help="replace an existing workbook")
    p.add_argument("--json", action="store_true",
                   help="print the campaign as JSON on stdout instead of the summary")
    p.add_argument("--choose", choices=CAMPAIGN_OBJECTIVES,
                   help="how to choose the facilities (default: the campaign file's "
                   "[campaign] choose, else largest_model)")
    add_paper_option(p)
    p.set_defaults(func=run)
    return p


def run(args) -> int:
    """Run ``similitude campaign``; returns the exit code."""
    targets = [workbook_path(args.output, example="campaign.xlsx")] if args.output else []
    check_targets(targets, args.force)
    campaign = load_campaign(args.campaign)
    if args.choose:
        campaign = replace(campaign, objective=args.choose)
    result = plan_campaign(campaign)
    json_out = json_text(result.to_dict()) if args.json else None
    written: list[Path] = []
    if args.output:
        # The workbook writer loads openpyxl (a heavy library): imported only for -o.
        from similitude.report.campaign_workbook import write_campaign

        written.append(write_campaign(result, args.output, overwrite=args.force,
                                      paper=args.paper))
    if json_out is not None:
        print(json_out)
    else:
        print(summary(result))
        print_written(written)
    return 0


def summary(result: CampaignPlan) -> str:
    """The terminal summary of a campaign: models, bookings, hours, reasons and cautions."""
    kinds = sorted({p.case.facility.kind for p in result.plans.values()})
    cautions = list(dict.fromkeys(caution_line(k) for k in kinds))
    return "\n".join(result.summary_lines() + cautions)

"""The plan in words: what the next period's workspace will hold."""

from __future__ import annotations

from rostertui.core.cycle.nextperiod import Plan


def preview_lines(plan: Plan) -> list[str]:
    """What the plan writes, in a few lines (the CLI's report and the UI's preview)."""
    source = f"{plan.source.name}/{plan.roster_label}" if plan.roster_label == "roster.toml" \
        else f"{plan.roster_label} of {plan.source.name}"
    out = [f"Next period in {plan.target}: {plan.start} to {plan.end} ({plan.days} days), "
           f"history from {source}"]
    out.append("  holidays: " + (", ".join(map(str, plan.holidays)) or "none"))
    if plan.needs:
        top = plan.needs[0]
        out.append(f"  history: {plan.history_days} days per person "
                   f"(longest look-back: {top.rule}, {top.why})")
    else:
        out.append("  history: no rule looks back before the period")
    if plan.hours_before:
        out.append("  hours_before (averaging window before the start):")
        for h in plan.hours_before.values():
            out.append(f"    {h.person:<10} {h.describe()}")
    out.append(f"  leave carried: {len(plan.leave_carried)} ({plan.leave_clipped} clipped to "
               f"start on {plan.start}, {plan.leave_dropped} past dropped)")
    out.append(f"  requests carried: {len(plan.requests_carried)} "
               f"({plan.requests_dropped} past dropped)")
    if plan.locks_dropped:
        out.append(f"  locks: {plan.locks_dropped} locked cells not carried (no roster yet)")
    out.append("  files: " + ", ".join(sorted(plan.files)))
    return out

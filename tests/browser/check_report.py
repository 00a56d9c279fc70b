#!/usr/bin/env python3
"""Renders a standfast report page in headless Chromium and checks it against the JSON of the
same run (and the history file the page was drawn from).

Usage: check_report.py PAGE.html ODDS.json HISTORY.sqlite OUT_DIR
       check_report.py --expect-failure PAGE.html OUT_DIR   (the checker must catch a bad page)

Checks: the page loads with no console message of level warning or error and no network
request (Chromium's own net log lists every request it makes); the rendered DOM holds every
team's name and each of its chances as the JSON gives them (the exact value in data-p, and the
text the table shows); every final-wins bar carries the JSON's count and is drawn to scale; every
point of the chances-through-the-season chart equals the history's value, its last point the
JSON's, and is drawn at the height of its value. Writes screenshots (desktop and phone width)
to OUT_DIR. Exit status 0 when every check passes, 1 otherwise, 77 when Chromium is missing.
"""
import json
import os
import shutil
import sqlite3
import subprocess
import sys
import tempfile
from html.parser import HTMLParser

CHROMIUM = shutil.which("chromium") or "/usr/bin/chromium"
FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
         "--disable-background-networking", "--disable-component-update", "--disable-sync",
         "--disable-default-apps", "--disable-extensions", "--mute-audio",
         "--enable-logging=stderr", "--v=0"]

failures = []


def fail(msg):
    failures.append(msg)
    print("FAIL:", msg)


def chromium(page, out_dir, extra, tag):
    """Runs Chromium once on the page with a fresh profile; returns (stdout, stderr, netlog)."""
    profile = tempfile.mkdtemp(prefix="standfast-chromium-")
    netlog = os.path.join(out_dir, f"netlog-{tag}.json")
    cmd = [CHROMIUM, *FLAGS, f"--user-data-dir={profile}", f"--log-net-log={netlog}",
           "--net-log-capture-mode=Default", *extra, "file://" + os.path.abspath(page)]
    try:
        r = subprocess.run(cmd, capture_output=True, text=True, timeout=120)
    finally:
        shutil.rmtree(profile, ignore_errors=True)
    with open(os.path.join(out_dir, f"chromium-{tag}.log"), "w") as f:
        f.write(r.stderr)
    return r.stdout, r.stderr, netlog


def console_problems(stderr):
    """Console messages of the page: Chromium logs them as 'CONSOLE' lines with --enable-logging."""
    return [line for line in stderr.splitlines() if "CONSOLE" in line]


def network_requests(netlog_path):
    """Every URL requested for the page, other than the page itself or inline data."""
    try:
        with open(netlog_path) as f:
            text = f.read()
    except OSError:
        return ["(no net log written)"]
    try:
        log = json.loads(text)
    except json.JSONDecodeError:
        # Chromium may leave the log without its closing brackets when it is stopped.
        try:
            log = json.loads(text.rstrip().rstrip(",") + "]}")
        except json.JSONDecodeError as e:
            return [f"(net log unreadable: {e})"]
    # A request made for the page carries the page's site (file://) in its network isolation
    # key; Chromium's own background requests (component updates and the like) do not.
    types = {v: k for k, v in log["constants"]["logEventTypes"].items()}
    urls = set()
    for ev in log.get("events", []):
        params = ev.get("params") or {}
        if types.get(ev.get("type")) != "URL_REQUEST_START_JOB":
            continue
        if not str(params.get("network_isolation_key", "")).startswith("file://"):
            continue
        url = str(params.get("url", ""))
        if not url.startswith(("file:", "data:", "about:", "chrome:")):
            urls.add(url)
    return sorted(urls)


class Dom(HTMLParser):
    """Collects the elements the checks need from the rendered DOM."""

    def __init__(self):
        super().__init__()
        self.rows = {}  # team id -> {"name": str, "cells": {field: (data-p, text)}}
        self.bars = {}  # team id -> [(wins, count, height)]
        self.points = {}  # team id -> [(kind, date, p, cy)]
        self.ids = {}  # element id -> (attrs, text)
        self._row = None
        self._cell = None
        self._text = None
        self._svg_team = None
        self._id = None
        self._table = None

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        if "id" in a:
            self._id = (a["id"], a)
            self.ids[a["id"]] = (a, "")
        if tag == "table":
            self._table = a.get("class")
        if tag == "tr" and "data-team" in a and self._table == "odds":
            self._row = a["data-team"]
            self.rows[self._row] = {"name": "", "cells": {}}
        elif tag == "th" and self._row is not None:
            self._text = ["name", ""]
        elif tag == "td" and self._row is not None and "data-field" in a:
            self._text = [a["data-field"], "", a["data-p"]]
        elif tag == "svg":
            self._svg_team = (a.get("class"), a.get("data-team"))
        elif tag == "rect" and self._svg_team and self._svg_team[0] == "wins-chart":
            self.bars.setdefault(self._svg_team[1], []).append(
                (int(a["data-wins"]), int(a["data-count"]), float(a["height"])))
        elif tag == "circle" and self._svg_team and self._svg_team[0] == "season-chart":
            self.points.setdefault(self._svg_team[1], []).append(
                (a["data-kind"], a["data-date"], float(a["data-p"]), float(a["cy"])))

    def handle_endtag(self, tag):
        self._id = None
        if tag in ("th", "td") and self._text is not None and self._row is not None:
            if self._text[0] == "name":
                self.rows[self._row]["name"] = self._text[1].strip()
            else:
                self.rows[self._row]["cells"][self._text[0]] = (float(self._text[2]),
                                                                self._text[1].strip())
            self._text = None
        elif tag == "tr":
            self._row = None
        elif tag == "svg":
            self._svg_team = None

    def handle_data(self, data):
        if self._text is not None:
            self._text[1] += data
        if self._id is not None:
            key, attrs = self._id
            self.ids[key] = (attrs, self.ids[key][1] + data)


def shown(p, status):
    """The text the table shows for a chance (tools/odds_report.h, format_chance)."""
    if status == "clinched":
        return "clinched"
    if status == "eliminated":
        return "eliminated"
    if p >= 1.0:
        return "100%*"
    if p <= 0.0:
        return "0%*"
    text = "%.1f" % (100.0 * p)
    if text == "0.0":
        return "<0.1%"
    if text == "100.0":
        return ">99.9%"
    return text + "%"


def check_page(page, odds_json, history, out_dir):
    dom_text, stderr, netlog = chromium(page, out_dir, ["--dump-dom"], "dom")
    with open(os.path.join(out_dir, "dom.html"), "w") as f:
        f.write(dom_text)
    if "<table" not in dom_text:
        fail("Chromium rendered no table (see chromium-dom.log)")
    for line in console_problems(stderr):
        fail("console message: " + line)
    for url in network_requests(netlog):
        fail("network request: " + url)

    with open(odds_json) as f:
        doc = json.load(f)
    dom = Dom()
    dom.feed(dom_text)
    run = doc["run"]
    if int(dom.ids.get("seasons", ({}, ""))[0].get("data-value", -1)) != run["seasons"]:
        fail("header: seasons differ from the JSON")
    if dom.ids.get("seed", ({}, ""))[1].strip() != str(run["seed"]):
        fail("header: seed differs from the JSON")
    if float(dom.ids.get("max-se", ({"data-value": "nan"}, ""))[0]["data-value"]) != run["max_se"]:
        fail("header: largest standard error differs from the JSON")
    if doc["caution"] not in dom_text:
        fail("the caution line is missing")

    as_of = dom.ids.get("as-of", ({}, ""))[0].get("datetime")
    db = sqlite3.connect(history)
    checked_points = 0
    for team in doc["teams"]:
        tid = team["team_id"]
        row = dom.rows.get(tid)
        if row is None:
            fail(f"{tid}: no table row")
            continue
        if row["name"] != team["team_name"]:
            fail(f"{tid}: name {row['name']!r}, JSON {team['team_name']!r}")
        fields = {"division": team["division_title"]}
        if run["postseason"]:
            fields["postseason"] = team["postseason"]
            fields["title"] = team["title"]
            if "bye" in row["cells"]:
                fields["bye"] = team["bye"]
        for field, chance in fields.items():
            if field not in row["cells"]:
                fail(f"{tid}: no {field} cell")
                continue
            p, text = row["cells"][field]
            status = chance.get("status", "")
            if p != chance["p"]:
                fail(f"{tid} {field}: data-p {p!r}, JSON {chance['p']!r}")
            if text != shown(chance["p"], status):
                fail(f"{tid} {field}: shows {text!r}, JSON gives {shown(chance['p'], status)!r}")

        hist = team["wins_histogram"]
        want = [(hist["first"] + i, c) for i, c in enumerate(hist["counts"])]
        bars = dom.bars.get(tid, [])
        if [(w, c) for w, c, _ in bars] != want:
            fail(f"{tid}: final-wins bars differ from the JSON histogram")
        elif bars:
            top_count = max(c for _, c, _ in bars)
            top_height = max(h for _, _, h in bars)
            for w, c, h in bars:
                if abs(h - top_height * c / top_count) > 0.011:
                    fail(f"{tid}: bar for {w} wins drawn {h}, expected {top_height * c / top_count}")

        pts = dom.points.get(tid, [])
        kinds = ["postseason", "title"] if run["postseason"] else ["division"]
        for kind in kinds:
            series = [(d, p, cy) for k, d, p, cy in pts if k == kind]
            column = {"postseason": "postseason_p", "title": "title_p",
                      "division": "division_p"}[kind]
            stored = db.execute(
                f"SELECT r.as_of, t.{column} FROM run r JOIN team_odds t ON t.run_id = r.id "
                "WHERE r.league = ? AND r.season_label = ? AND t.team = ? AND r.id IN "
                "(SELECT max(id) FROM run WHERE league = ? AND season_label = ? GROUP BY as_of) "
                "AND r.as_of <= ? ORDER BY r.as_of",
                (run["league"], run["season"], tid, run["league"], run["season"], as_of)).fetchall()
            if [(d, p) for d, p, _ in series] != [(d, p) for d, p in stored]:
                fail(f"{tid} {kind}: chart points differ from the history")
            if not series or series[-1][0] != as_of:
                fail(f"{tid} {kind}: the chart does not end at the as-of date {as_of}")
            else:
                json_p = team[{"postseason": "postseason", "title": "title",
                               "division": "division_title"}[kind]]["p"]
                if series[-1][1] != json_p:
                    fail(f"{tid} {kind}: last point {series[-1][1]!r}, JSON {json_p!r}")
            for d, p, cy in series:
                if abs(cy - (76 - p * 70)) > 0.011:
                    fail(f"{tid} {kind} {d}: point drawn at {cy}, expected {76 - p * 70}")
                checked_points += 1
    if not doc["teams"]:
        fail("the JSON has no team")

    for name, size in (("report-desktop.png", "1280,2200"), ("report-phone.png", "390,2600")):
        _, stderr, _ = chromium(page, out_dir, [f"--screenshot={os.path.join(out_dir, name)}",
                                                f"--window-size={size}",
                                                "--hide-scrollbars"], name.split(".")[0])
        if not os.path.exists(os.path.join(out_dir, name)):
            fail(f"no screenshot {name}")
    print(f"checked {len(doc['teams'])} teams, {checked_points} chart points; screenshots in "
          f"{out_dir}")


def main():
    if not os.path.exists(CHROMIUM):
        print("chromium not installed: skipped")
        return 77
    if sys.argv[1] == "--expect-failure":
        page, out_dir = sys.argv[2], sys.argv[3]
        os.makedirs(out_dir, exist_ok=True)
        _, stderr, netlog = chromium(page, out_dir, ["--dump-dom"], "bad")
        found = console_problems(stderr) + network_requests(netlog)
        print("\n".join(found))
        return 0 if found else 1
    page, odds_json, history, out_dir = sys.argv[1:5]
    os.makedirs(out_dir, exist_ok=True)
    check_page(page, odds_json, history, out_dir)
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())

"""explorer.html: the data it embeds, and the page driven in a real headless Chromium.

The browser tests skip (with the reason) when Chromium, its driver or selenium is
missing; docs_ci_browser.md has the install lines.  Expected values come from the
census tables read with pandas, never from the explorer's own Python code.
"""

from __future__ import annotations

import base64
import gzip
import json
import re
import shutil
from pathlib import Path

import pytest

from _census_fixture import shared_census
from pipeline.census.reader import exact_int, open_census
from pipeline.present.explorer import COLUMNS, explorer_data, explorer_html, write_explorer

CHROME_ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run",
               "--disable-background-networking", "--disable-component-update", "--disable-sync",
               "--window-size=1400,1000"]


@pytest.fixture(scope="module")
def census(tmp_path_factory):
    return open_census(shared_census(tmp_path_factory))


def _expected(census) -> dict:
    """knot key -> (determinant, signature, chirality) read off the tables directly."""
    d = census.diagrams
    out = {}
    for _, k in census.knots.iterrows():
        rows = d[(d["knot_key"] == k["knot_key"]) & (d["notation"] == k["representative"])]
        r = rows.iloc[0]
        amph = k["amphichiral"]
        out[k["knot_key"]] = (exact_int(r["determinant"], r["determinant_text"]),
                              None if r["signature"] is None or str(r["signature"]) == "<NA>" else int(r["signature"]),
                              "unknown" if str(amph) == "<NA>" else ("amphichiral" if amph else "chiral"))
    return out


def test_every_knot_type_once_with_its_stored_invariants(census):
    data = explorer_data(census, draw_per_family=2)
    recs = {r[0]: dict(zip(COLUMNS, r)) for r in data["knots"]}
    assert sorted(recs) == sorted(census.knots["knot_key"].tolist())
    for key, (det, sig, chir) in _expected(census).items():
        rec = recs[key]
        assert (int(rec["det"]), rec["sig"], rec["chir"]) == (det, sig, chir), key
        assert len(rec["rows"]) == min(int((census.diagrams["knot_key"] == key).sum()), 60)
        assert all(row[3] in rec["search"] for row in rec["rows"])
    # drawn: the 2 knot types of fewest crossings of each family, and no others
    drawn = {k for k, r in recs.items() if r["svg"] >= 0}
    for fam in set(census.diagrams["family"]):
        members = sorted((r["cr"], k) for k, r in recs.items() if fam in r["fams"].split(", "))
        assert {k for _, k in members[:2]} <= drawn
    assert len(data["svgs"]) == len(drawn) and all(s.startswith("<svg") for s in data["svgs"])


def test_polynomials_stay_exact_beyond_double_precision(census):
    # the Jones polynomial of the trefoil T(2,3) is -t^-4 + t^-3 + t^-1 for one chirality and
    # t + t^3 - t^4 for the other (Jones 1985, from memory); the page gets exact strings
    recs = {r[0]: dict(zip(COLUMNS, r)) for r in explorer_data(census, draw_per_family=0)["knots"]}
    tre = recs["torus:2,3"]["jones"]
    assert tre in ([["1", "1"], ["3", "1"], ["4", "-1"]], [["-4", "-1"], ["-3", "1"], ["-1", "1"]])
    from pipeline.present.explorer import _poly
    assert _poly("[[0.5, 123456789012345678901], [2.5, -1]]") == [["1/2", "123456789012345678901"], ["5/2", "-1"]]


def test_large_data_is_embedded_compressed_and_round_trips(census):
    data = explorer_data(census, draw_per_family=0)
    page = explorer_html(data, compress_over=0)
    payload = re.search(r'<script id="kl-data" type="application/gzip-base64">([^<]*)</script>', page).group(1)
    assert json.loads(gzip.decompress(base64.b64decode(payload)))["knots"] == data["knots"]
    plain = explorer_html(data)
    assert 'type="application/json"' in plain and "http://" not in plain.replace("http://www.w3.org/2000/svg", "")


# ------------------------------------------------------------------ real browser
def _driver(tmp_path, monkeypatch):
    chromium = shutil.which("chromium") or shutil.which("chromium-browser")
    chromedriver = shutil.which("chromedriver")
    if not chromium or not chromedriver:
        pytest.skip("Chromium or chromedriver not installed (see docs_ci_browser.md)")
    webdriver = pytest.importorskip("selenium.webdriver", reason="selenium not installed (see docs_ci_browser.md)")
    monkeypatch.setenv("SE_OFFLINE", "true")  # the driver is given: never ask the network for one
    opts = webdriver.ChromeOptions()
    opts.binary_location = chromium
    for arg in CHROME_ARGS + [f"--user-data-dir={tmp_path / 'profile'}"]:
        opts.add_argument(arg)
    opts.set_capability("goog:loggingPrefs", {"browser": "ALL"})
    return webdriver.Chrome(options=opts, service=webdriver.ChromeService(executable_path=chromedriver))


@pytest.fixture(params=["plain", "compressed"])
def page(request, census, tmp_path, monkeypatch):
    out = tmp_path / "explorer.html"
    write_explorer(census, out, draw_per_family=3, compress_over=0 if request.param == "compressed" else 10 ** 9)
    driver = _driver(tmp_path, monkeypatch)
    from selenium.webdriver.support.ui import WebDriverWait
    try:
        driver.get(out.as_uri())
        WebDriverWait(driver, 30).until(lambda d: d.execute_script("return document.body.dataset.ready") == "1")
        yield driver
    finally:
        driver.quit()


def _by(driver, css):
    from selenium.webdriver.common.by import By
    return driver.find_elements(By.CSS_SELECTOR, css)


def _show_all(driver):
    from selenium.webdriver.support.ui import Select
    Select(_by(driver, "#page-size")[0]).select_by_visible_text("500")


def _count(driver) -> int:
    return int(_by(driver, "#count")[0].text.split()[0])


def _column(driver, col):
    return [td.get_attribute("textContent") for td in _by(driver, f'#rows td[data-col="{col}"]')]


def test_page_in_chromium(page, census):
    driver, expected = page, _expected(census)
    n = len(census.knots)
    _show_all(driver)
    # row count = knots table
    assert _count(driver) == n and len(_by(driver, "#rows tr")) == n
    assert sorted(tr.get_attribute("data-key") for tr in _by(driver, "#rows tr")) == sorted(expected)
    # sorting by determinant orders the rows (both directions)
    head = _by(driver, '#knots th[data-col="det"]')[0]
    head.click()
    dets = [int(v) for v in _column(driver, "det")]
    assert dets == sorted(e[0] for e in expected.values())
    head.click()
    assert [int(v) for v in _column(driver, "det")] == sorted(dets, reverse=True)
    # a filter shows the expected subset: chiral, signature 0, at most 8 crossings
    from selenium.webdriver.support.ui import Select
    Select(_by(driver, "#chir")[0]).select_by_visible_text("chiral")
    for css, value in (("#sig-min", "0"), ("#sig-max", "0"), ("#cr-max", "8")):
        _by(driver, css)[0].send_keys(value)
    cr = {k: int(c) for k, c in zip(census.knots["knot_key"], census.knots["crossing_number"].fillna(
        census.knots["min_crossings_seen"]))}
    want = {k for k, (det, sig, chir) in expected.items() if chir == "chiral" and sig == 0 and cr[k] <= 8}
    assert want, "the fixture should have chiral knots of signature 0"
    assert {tr.get_attribute("data-key") for tr in _by(driver, "#rows tr")} == want and _count(driver) == len(want)
    # text search on notations: a pretzel notation finds its knot type
    _by(driver, "#reset")[0].click()
    _by(driver, "#q")[0].send_keys("pretzel:-3,-3,-3")
    keys = {tr.get_attribute("data-key") for tr in _by(driver, "#rows tr")}
    d = census.diagrams
    assert keys and keys == set(d[d["notation"].str.contains("pretzel:-3,-3,-3", regex=False)]["knot_key"])
    # a chart bar filters the table
    _by(driver, "#reset")[0].click()
    _by(driver, '#charts rect.bar[data-label="amphichiral"]')[0].click()
    assert _count(driver) == sum(1 for e in expected.values() if e[2] == "amphichiral")
    # clicking a row opens its card with the drawing (the smallest types are drawn)
    _by(driver, "#reset")[0].click()
    _by(driver, '#knots th[data-col="cr"]')[0].click()
    row = _by(driver, "#rows tr")[0]
    key = row.get_attribute("data-key")
    row.click()
    card = _by(driver, "#card")[0]
    assert card.is_displayed() and key in card.text
    assert _by(driver, "#card svg.knotledger-diagram") and _by(driver, "#card svg text.arc")
    assert str(expected[key][0]) in card.text and "Jones V(t)" in card.text
    # no console errors
    errors = [e for e in driver.get_log("browser") if e.get("level") == "SEVERE"]
    assert errors == []

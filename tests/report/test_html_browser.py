"""The example's HTML report in a real headless browser (Chromium, from the Debian
packages; .ci/run installs it when absent and it can). Skipped, saying so, where no
Chromium is found.

Chromium's own parser and renderer are the outside reference: ``--dump-dom`` gives the
document as the browser built it (the verdict and the inline SVG plots must be in it),
``--screenshot`` the page as drawn (it must not be blank, above or below the fold of the
first plots)."""

from __future__ import annotations

import shutil
import subprocess
import sys

import pytest
from support import EXAMPLE

pytest.importorskip("matplotlib")

BROWSER = next((shutil.which(name) for name in ("chromium", "chromium-browser", "google-chrome")
                if shutil.which(name)), None)
pytestmark = pytest.mark.skipif(BROWSER is None, reason="no Chromium found (apt-get install "
                                "chromium); the browser test of the HTML report is skipped")
FLAGS = ["--headless", "--no-sandbox", "--disable-gpu", "--hide-scrollbars",
         "--window-size=1000,2400"]


@pytest.fixture(scope="module")
def page(tmp_path_factory):
    folder = tmp_path_factory.mktemp("browser")
    path = folder / "report.html"
    subprocess.run([sys.executable, "-m", "vcheck", "check", "--report", f"html={path}"],
                   cwd=EXAMPLE, capture_output=True, check=False)
    assert path.is_file()
    return path


def test_the_browser_builds_the_verdict_and_the_plots(page):
    ran = subprocess.run([BROWSER, *FLAGS, "--dump-dom", page.as_uri()], capture_output=True,
                         text=True, timeout=120)
    assert ran.returncode == 0, ran.stderr[-2000:]
    dom = ran.stdout
    assert 'id="verdict">Verdict: FAIL</p>' in dom
    assert dom.count("<svg") >= 50 and dom.count("<figure") >= 50
    for kind in ("interference", "transmissibility", "mount-forces", "mount-directions", "s-n",
                 "joint"):
        assert f'data-plot="{kind}"' in dom, kind


def test_the_screenshot_is_not_blank(page, tmp_path):
    from matplotlib.image import imread

    shot = tmp_path / "report.png"
    ran = subprocess.run([BROWSER, *FLAGS, f"--screenshot={shot}", page.as_uri()],
                         capture_output=True, text=True, timeout=120)
    assert ran.returncode == 0 and shot.is_file(), ran.stderr[-2000:]
    pixels = imread(str(shot))[..., :3].mean(axis=2)  # 0 black .. 1 white
    assert pixels.shape == (2400, 1000)
    top, bottom = pixels[:300], pixels[800:]  # the verdict; the first plots
    for part in (top, bottom):
        dark = (part < 0.5).mean()
        assert 0.005 < dark < 0.5, dark

"""Third-party files shipped inside loadscope, each with its licence beside it.

``plotly-basic.min.js`` is plotly.js's own 2D bundle (scatter, bar, pie; the
npm package ``plotly.js-basic-dist-min``, MIT licence in
``plotly-basic.LICENSE``), about a quarter of the full bundle. The dashboard
pages load it because every figure they draw with plotly.js is 2D (the 3D
scene has its own canvas renderer, ``widgets/scene3d.js``). It is kept at the
plotly.js version of the installed plotly package; ``make plotly-basic``
(``tools/fetch_plotly_basic.sh``) fetches it again with npm.
"""

from __future__ import annotations

import re
from pathlib import Path

#: the 2D-only plotly.js bundle the dashboard pages load
PLOTLY_BASIC = Path(__file__).with_name("plotly-basic.min.js")


def js_version(path: Path) -> str:
    """The plotly.js version in the licence header of a plotly.js bundle.

    >>> js_version(PLOTLY_BASIC).count(".")
    2
    """
    with open(path, encoding="utf-8") as f:
        head = f.read(300)
    found = re.search(r"plotly\.js[^\n]*? v(\d+\.\d+\.\d+)", head)
    if not found:
        raise ValueError(f"{path} does not start with a plotly.js licence header")
    return found.group(1)


def installed_plotly_js() -> Path:
    """The full ``plotly.min.js`` shipped in the installed plotly package."""
    import plotly

    return Path(plotly.__file__).parent / "package_data" / "plotly.min.js"

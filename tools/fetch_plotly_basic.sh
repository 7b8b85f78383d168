#!/bin/sh
# Fetch plotly.js's 2D bundle (npm package plotly.js-basic-dist-min) at the
# plotly.js version of the installed plotly package into loadscope/vendor/,
# with its licence. Run from the repository root: `make plotly-basic`.
set -eu
PY=${PYTHON:-.venv/bin/python}
version=$("$PY" -c "from loadscope.vendor import installed_plotly_js, js_version; print(js_version(installed_plotly_js()))")
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
(cd "$tmp" && npm pack --silent "plotly.js-basic-dist-min@$version" >/dev/null && tar xzf ./*.tgz)
cp "$tmp/package/plotly-basic.min.js" loadscope/vendor/plotly-basic.min.js
cp "$tmp/package/LICENSE" loadscope/vendor/plotly-basic.LICENSE
echo "loadscope/vendor/plotly-basic.min.js: plotly.js $version"

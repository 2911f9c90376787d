#!/usr/bin/env bash
# The OpenAPI tests run the API's Python and R examples with the clients modellers use: Python
# with requests and pandas, R with httr2 and jsonlite (tests/e2e/openapi.test.ts skips them,
# saying so, when they are missing). Install Debian's packages when we may (CI runs as root).
set -euo pipefail
have_python() { for p in python3 /usr/bin/python3; do "$p" -c 'import pandas, requests' 2>/dev/null && return 0; done; return 1; }
have_r() { Rscript -e 'library(httr2); library(jsonlite)' >/dev/null 2>&1; }
if have_python && have_r; then exit 0; fi
if [ "$(id -u)" -eq 0 ] && command -v apt-get >/dev/null; then
	echo "Installing Debian's pandas, requests, R, httr2 and jsonlite for the API example tests…"
	apt-get update -qq
	DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends \
		python3-pandas python3-requests r-base-core r-cran-httr2 r-cran-jsonlite >/dev/null
	exit 0
fi
echo "The API example tests will skip Python and/or R: install python3-pandas python3-requests r-base-core r-cran-httr2 r-cran-jsonlite to run them." >&2

#!/usr/bin/env bash
# The BibTeX test (tests/integration/texToolchain.test.ts) runs Debian's bibtex and pdflatex when
# they are installed and skips, saying so, when they are not. Install them where we may (CI runs
# as root): texlive-latex-base without recommends, about 37 MB to download and 118 MB installed.
# Never fails the run: the suite does not depend on TeX.
set -uo pipefail
if command -v pdflatex >/dev/null && command -v bibtex >/dev/null; then exit 0; fi
if [ "$(id -u)" -eq 0 ] && command -v apt-get >/dev/null; then
	echo "Installing Debian's texlive-latex-base for the BibTeX test…"
	if apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq --no-install-recommends texlive-latex-base >/dev/null; then
		exit 0
	fi
fi
echo "pdflatex/bibtex not installed: the BibTeX test will be skipped (apt-get install texlive-latex-base)." >&2
exit 0

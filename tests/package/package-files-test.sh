#!/usr/bin/env bash
# Checks the desktop-integration files and man pages in packaging/ without installing anything:
# the .desktop entry (desktop-file-validate), the AppStream metadata (appstreamcli, strict),
# the .sagline file type (detected by content in a private MIME database), the man pages
# (man --warnings, and every command of `sagline-cli --help` documented), and that every file
# that names a version names the project's.
#
# usage: package-files-test.sh SOURCE_DIR VERSION SAGLINE_CLI
set -euo pipefail

source_dir=$1
version=$2
cli=$3
packaging=$source_dir/packaging
app_id=org.sagline.Sagline
failures=0

fail() {
    echo "FAIL: $*" >&2
    failures=$((failures + 1))
}
pass() { echo "ok: $*"; }

for tool in desktop-file-validate appstreamcli update-mime-database gio sqlite3 man dpkg-parsechangelog; do
    command -v "$tool" >/dev/null || { echo "FAIL: $tool is missing: run scripts/install-deps.sh" >&2; exit 1; }
done

work=$(mktemp -d)
trap 'rm -rf "$work"' EXIT

# --- .desktop entry and AppStream metadata ----------------------------------------------------
if out=$(desktop-file-validate "$packaging/$app_id.desktop" 2>&1) && [ -z "$out" ]; then
    pass "desktop-file-validate $app_id.desktop: no findings"
else
    fail "desktop-file-validate $app_id.desktop: $out"
fi
if out=$(appstreamcli validate --no-net --strict "$packaging/$app_id.metainfo.xml" 2>&1); then
    pass "appstreamcli validate --strict: $(echo "$out" | tail -n 1)"
else
    fail "appstreamcli validate --strict $app_id.metainfo.xml:"$'\n'"$out"
fi

# --- Versions: metainfo release, Debian changelog, man page headers --------------------------
grep -q "<release version=\"$version\"" "$packaging/$app_id.metainfo.xml" \
    && pass "metainfo has a <release> for $version" \
    || fail "$app_id.metainfo.xml has no <release version=\"$version\">: add one for the new version"
changelog_version=$(dpkg-parsechangelog -l "$packaging/doc/changelog" -S Version)
[ "$changelog_version" = "$version" ] \
    && pass "packaging/doc/changelog's latest entry is $version" \
    || fail "packaging/doc/changelog's latest entry is $changelog_version, the project is $version: add an entry"

# --- Man pages -----------------------------------------------------------------------------------
for page in "$packaging"/man/*.1 "$packaging"/man/*.5; do
    name=$(basename "$page")
    grep -q "^\.TH .*\"Sagline $version\"" "$page" \
        || fail "$name: .TH does not name \"Sagline $version\""
    if warnings=$(LC_ALL=C.UTF-8 MANWIDTH=80 man --warnings -l "$page" 2>&1 >/dev/null) && [ -z "$warnings" ]; then
        pass "man --warnings $name: none"
    else
        fail "man --warnings $name:"$'\n'"$warnings"
    fi
done
# Every command that `sagline-cli --help` lists must have its entry in sagline-cli.1.
# A command's line starts with two spaces and its name; continuation lines are indented further.
commands=$("$cli" --help | sed -n '/^commands:/,/^$/p' | sed -n 's/^  \([a-z][a-z-]*\) .*/\1/p')
[ -n "$commands" ] || fail "found no commands in 'sagline-cli --help'"
for command in $commands; do
    grep -Eq "^(\.(B|BI|BR) \"?$command( |\"|$)|\\\\fB$command\\\\f[PR] )" "$packaging/man/sagline-cli.1" \
        && pass "sagline-cli.1 documents '$command'" \
        || fail "packaging/man/sagline-cli.1 does not document the command '$command' that 'sagline-cli --help' lists"
done

# --- The .sagline file type: recognised by content, not by name -------------------------------
# The application_id comes from the store's own header, so a change there shows up here.
app_id_hex=$(sed -n 's/.*sessionApplicationId = 0x\([0-9A-Fa-f]*\)u.*/\1/p' "$source_dir/core/SessionSchema.h")
[ -n "$app_id_hex" ] || { echo "FAIL: no sessionApplicationId in core/SessionSchema.h" >&2; exit 1; }
grep -qi "type=\"big32\" offset=\"68\" value=\"0x$app_id_hex\"" "$packaging/sagline-mime.xml" \
    || fail "sagline-mime.xml does not match application_id 0x$app_id_hex (core/SessionSchema.h) at offset 68"
mkdir -p "$work/xdg/mime/packages" "$work/files"
cp "$packaging/sagline-mime.xml" "$work/xdg/mime/packages/sagline.xml"
update-mime-database "$work/xdg/mime" >/dev/null 2>&1 || fail "update-mime-database rejected sagline-mime.xml"
app_id_decimal=$((16#$app_id_hex))
sqlite3 "$work/files/bench-7" "PRAGMA application_id = $app_id_decimal; CREATE TABLE t(x);"
sqlite3 "$work/files/other.sagline" "CREATE TABLE t(x);"
sqlite3 "$work/files/other-application" "PRAGMA application_id = $((app_id_decimal + 1)); CREATE TABLE t(x);"
cp "$work/files/bench-7" "$work/files/bench-7.sagline"
expect_type() {
    local file=$1 expected=$2 actual
    actual=$(XDG_DATA_HOME="$work/xdg" XDG_DATA_DIRS=/usr/share \
        gio info -a standard::content-type "$work/files/$file" | sed -n 's/.*content-type: //p')
    [ "$actual" = "$expected" ] && pass "$file is $actual" || fail "$file: expected $expected, got '$actual'"
}
expect_type bench-7 application/x-sagline-session                # our application_id, no name hint
expect_type bench-7.sagline application/x-sagline-session
expect_type other.sagline application/vnd.sqlite3               # the name alone does not make it ours
expect_type other-application application/vnd.sqlite3

if [ "$failures" -ne 0 ]; then
    echo "$failures check(s) failed" >&2
    exit 1
fi
echo "all packaging file checks passed"

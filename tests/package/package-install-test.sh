#!/usr/bin/env bash
# Builds the Debian package from BUILD_DIR with cpack, checks it with lintian (no errors, and
# every warning listed as accepted in DEVELOPERS.md), installs it on this machine with dpkg -i,
# runs the installed programs from their installed paths in a bare environment, then purges the
# package and checks that nothing it installed is left behind.
# Needs root (dpkg); CI runs it as root on a throwaway clone. A lock keeps two runs on one
# machine from overlapping.
#
# usage: package-install-test.sh SOURCE_DIR BUILD_DIR VERSION GIT_COMMIT PROGRAM...
set -euo pipefail

source_dir=$1
build_dir=$2
version=$3
commit=$4
shift 4
programs=("$@")
package=sagline
app_id=org.sagline.Sagline
failures=0

fail() {
    echo "FAIL: $*" >&2
    failures=$((failures + 1))
}
pass() { echo "ok: $*"; }
has_program() {
    local p
    for p in "${programs[@]}"; do [ "$p" = "$1" ] && return 0; done
    return 1
}

if [ "$(id -u)" -ne 0 ]; then
    echo "FAIL: the package install test runs dpkg -i and needs root" >&2
    exit 1
fi
for tool in cpack lintian dpkg-deb dpkg-shlibdeps flock timeout readelf file gio sqlite3 python3; do
    command -v "$tool" >/dev/null || { echo "FAIL: $tool is missing: run scripts/install-deps.sh" >&2; exit 1; }
done

exec 9>/var/lock/sagline-package-test.lock
flock -w 900 9 || { echo "FAIL: another package test held the lock for 15 minutes" >&2; exit 1; }

if dpkg-query -W -f='${db:Status-Status}' "$package" 2>/dev/null | grep -qv '^not-installed$'; then
    echo "FAIL: $package is already installed on this machine; remove it (dpkg -P $package) first" >&2
    exit 1
fi

work=$(mktemp -d)
installed_by_us=0
cleanup() {
    if [ "$installed_by_us" -eq 1 ]; then
        echo "cleanup: purging $package after a failure" >&2
        dpkg -P "$package" >/dev/null 2>&1 || true
    fi
    rm -rf "$work"
}
trap cleanup EXIT

# --- Build the package ---------------------------------------------------------------------------
echo "== cpack"
cpack --config "$build_dir/CPackConfig.cmake" -B "$work/out" >"$work/cpack.log" 2>&1 \
    || { cat "$work/cpack.log" >&2; echo "FAIL: cpack failed" >&2; exit 1; }
debs=("$work"/out/*.deb)
[ "${#debs[@]}" -eq 1 ] && [ -f "${debs[0]}" ] || { echo "FAIL: cpack made no single .deb" >&2; exit 1; }
deb=${debs[0]}
echo "package: $(basename "$deb"), $(stat -c %s "$deb") bytes"
dpkg-deb --info "$deb"
dpkg-deb --contents "$deb" | tee "$work/contents"

[ "$(dpkg-deb -f "$deb" Version)" = "$version" ] && pass "Version: $version" \
    || fail "package version $(dpkg-deb -f "$deb" Version), project $version"
depends=$(dpkg-deb -f "$deb" Depends)
[[ $depends == *libc6* ]] && pass "Depends computed by dpkg-shlibdeps: $depends" \
    || fail "Depends lacks libc6, shlibdeps did not run: '$depends'"

# The package's paths, as they will be on the machine (./usr/bin/ -> /usr/bin).
awk '{ print $6 }' "$work/contents" | sed -e 's|^\./|/|' -e 's|/$||' | grep -v '^$' | grep -v '^/$' >"$work/paths"
expected=(/usr/share/$package/demo-setup.json /usr/share/$package/lab-sheet-40va-toroid.json
          /usr/share/$package/lab-sheet-12va-laminated.json /usr/share/man/man5/sagline-labsheet.5.gz
          /usr/share/doc/$package/copyright
          /usr/share/doc/$package/changelog.gz /usr/share/mime/packages/sagline.xml)
for program in "${programs[@]}"; do
    expected+=("/usr/bin/$program" "/usr/share/man/man1/$program.1.gz")
done
if has_program sagline; then
    expected+=(/usr/share/applications/$app_id.desktop /usr/share/metainfo/$app_id.metainfo.xml
               /usr/share/icons/hicolor/scalable/apps/$app_id.svg /usr/share/icons/hicolor/48x48/apps/$app_id.png
               /usr/share/icons/hicolor/256x256/apps/$app_id.png)
fi
for path in "${expected[@]}"; do
    grep -qx "$path" "$work/paths" && pass "package holds $path" || fail "package lacks $path"
done

# --- lintian -------------------------------------------------------------------------------------
echo "== lintian"
lintian --allow-root --display-level ">=info" "$deb" >"$work/lintian.log" 2>&1 || true
cat "$work/lintian.log"
if grep -q '^E: ' "$work/lintian.log"; then
    fail "lintian reports errors (above)"
else
    pass "lintian: no errors"
fi
# Each warning must be one the contributor guide accepts, with its reason.
accepted=$(sed -n '/^### Accepted lintian findings/,/^##/p' "$source_dir/DEVELOPERS.md")
while read -r tag; do
    [ -z "$tag" ] && continue
    grep -q "\`$tag\`" <<<"$accepted" && pass "lintian warning $tag is accepted in DEVELOPERS.md" \
        || fail "lintian warning $tag is not listed under 'Accepted lintian findings' in DEVELOPERS.md"
done < <(sed -n 's/^W: [^:]*: \([a-z0-9-]*\).*/\1/p' "$work/lintian.log" | sort -u)

# --- Install -------------------------------------------------------------------------------------
echo "== dpkg -i"
while read -r path; do
    if [ -e "$path" ] || [ -L "$path" ]; then echo "$path"; fi
done <"$work/paths" >"$work/existed-before"
installed_by_us=1
dpkg -i "$deb" >"$work/dpkg-i.log" 2>&1 || { cat "$work/dpkg-i.log" >&2; echo "FAIL: dpkg -i failed" >&2; exit 1; }
pass "dpkg -i $(basename "$deb")"
dpkg -L "$package" | grep -v '^/\.$' >"$work/dpkg-list"

# Run the installed programs the way a user would: a bare environment, a fresh home, an
# unrelated working folder, nothing pointing into the source or build tree.
mkdir -p "$work/home" "$work/cwd"
run() { (cd "$work/cwd" && env -i PATH=/usr/bin:/bin HOME="$work/home" LC_ALL=C.UTF-8 "$@"); }

for program in "${programs[@]}"; do
    location=$(run sh -c "command -v $program" || true)
    [ "$location" = "/usr/bin/$program" ] && pass "$program is /usr/bin/$program" \
        || fail "$program resolves to '$location', not /usr/bin/$program"
    runpath=$(readelf -d "/usr/bin/$program" | grep -E 'RUNPATH|RPATH' || true)
    [ -z "$runpath" ] && pass "$program has no RUNPATH" || fail "$program carries $runpath"
    missing=$(run ldd "/usr/bin/$program" | grep 'not found' || true)
    [ -z "$missing" ] && pass "$program: every shared library resolves" || fail "$program: $missing"
    # No display and no QT_QPA_PLATFORM: --version must answer anyway.
    output=$(run timeout 20 "/usr/bin/$program" --version 2>&1) || true
    if [[ $output == *"$version"* && $output == *"$commit"* ]]; then
        pass "$program --version: $output"
    else
        fail "$program --version should name $version and commit $commit, printed: '$output'"
    fi
done

if has_program sagline-cli; then
    demo=/usr/share/$package/demo-setup.json
    [ -f /usr/share/$package/demo-readings.csv ] && run sagline-cli fit /usr/share/$package/demo-readings.csv >/dev/null \
        && pass "sagline-cli fit /usr/share/$package/demo-readings.csv" \
        || fail "sagline-cli fit on the installed demo readings failed"
    if run sagline-cli plan "$demo" >"$work/plan.txt" 2>&1 && grep -q 'Load sweep plan' "$work/plan.txt"; then
        pass "sagline-cli plan $demo"
        head -n 3 "$work/plan.txt"
    else
        fail "sagline-cli plan $demo:"$'\n'"$(cat "$work/plan.txt")"
    fi
    if run sagline-cli plan "$demo" --json >"$work/plan.json" \
        && python3 -c 'import json,sys; p=json.load(open(sys.argv[1])); assert p["recommended_fuse"]["rating_a"] > 0 and len(p["steps"]) > 1' "$work/plan.json"; then
        pass "sagline-cli plan --json: recommended fuse and steps present"
    else
        fail "sagline-cli plan $demo --json did not give a plan with a fuse and steps"
    fi
    # A whole sweep on the built-in virtual bench into a new session, then its fit.
    if run sagline-cli run "$demo" --sim -o "$work/cwd/cli-sweep.sagline" >"$work/run.txt" 2>&1 \
        && run sagline-cli fit "$work/cwd/cli-sweep.sagline" --json >"$work/fit.json" \
        && python3 -c 'import json,sys; f=json.load(open(sys.argv[1])); assert f["n"] >= 3 and f["series_resistance_ohm"] > 0' "$work/fit.json"; then
        pass "sagline-cli run --sim wrote a session and fit --json read it back"
    else
        fail "sagline-cli run --sim / fit on the installed demo setup:"$'\n'"$(tail -n 20 "$work/run.txt")"
    fi
    if run sagline-cli --help | grep -q '^  report '; then
        # The PDF report, headless, with whatever fonts the package's dependencies bring.
        if run sagline-cli report "$work/cwd/cli-sweep.sagline" -o "$work/cwd/report.pdf" >"$work/report.txt" 2>&1 \
            && file -b "$work/cwd/report.pdf" | grep -q '^PDF document'; then
            pass "sagline-cli report wrote a PDF ($(stat -c %s "$work/cwd/report.pdf") bytes)"
        else
            fail "sagline-cli report:"$'\n'"$(cat "$work/report.txt")"
        fi
    fi
    # The program finds its data through its own location (core/DataDirectory.h), not the build tree.
    help_data=$(run sagline-cli --help | sed -n 's/^Demo setup: //p')
    [ "$help_data" = "$demo" ] && pass "installed sagline-cli finds its data in /usr/share/$package" \
        || fail "installed sagline-cli locates its demo setup at '$help_data', expected $demo"
fi

if has_program sagline-sim; then
    # The virtual bench on the installed demo setup: up and serving until stopped after 2 s.
    status=0
    run timeout 2 sagline-sim /usr/share/$package/demo-setup.json --tcp-port 0 --no-pty </dev/null \
        >"$work/sim.txt" 2>&1 || status=$?
    if [ "$status" -eq 124 ] && grep -q 'virtual bench' "$work/sim.txt"; then
        pass "sagline-sim served the demo transformer until stopped after 2 s"
    else
        fail "sagline-sim exited with status $status:"$'\n'"$(cat "$work/sim.txt")"
    fi
fi

session=""
[ -f "$work/cwd/cli-sweep.sagline" ] && session=$work/cwd/cli-sweep.sagline
if has_program sagline; then
    gui() { run env QT_QPA_PLATFORM=offscreen XDG_RUNTIME_DIR="$work/home" "$@"; }
    # Still running after 3 s on the offscreen platform: it started, built its window, did not crash.
    status=0
    gui timeout 3 sagline >"$work/gui.log" 2>&1 || status=$?
    [ "$status" -eq 124 ] && pass "sagline ran on the offscreen platform until stopped after 3 s" \
        || fail "sagline exited with status $status within 3 s:"$'\n'"$(cat "$work/gui.log")"
    # A whole demonstration sweep through the installed program writes a real session file.
    status=0
    gui timeout 120 sagline --screenshot "$work/shots" >"$work/gui-demo.log" 2>&1 || status=$?
    gui_session=$(find "$work/shots/sessions" -name '*.sagline' 2>/dev/null | head -n 1)
    if [ "$status" -eq 0 ] && [ -n "$gui_session" ] && ls "$work"/shots/*.png >/dev/null 2>&1; then
        pass "sagline --screenshot ran the demo sweep: $(basename "$gui_session") and $(cd "$work/shots" && ls ./*.png | tr '\n' ' ')"
        session=$gui_session
    else
        fail "sagline --screenshot (status $status) made no session or no image:"$'\n'"$(cat "$work/gui-demo.log")"
    fi
    # Opening that session as the menu entry does on a double-click (Exec=sagline %f).
    if [ -n "$session" ]; then
        status=0
        gui timeout 3 sagline "$session" >"$work/gui-open.log" 2>&1 || status=$?
        [ "$status" -eq 124 ] && pass "sagline started with the session file as its argument and stayed up 3 s" \
            || fail "sagline $session exited with status $status:"$'\n'"$(cat "$work/gui-open.log")"
    fi
fi

# Desktop integration as the triggers of shared-mime-info and desktop-file-utils left it.
if [ -x /usr/bin/update-mime-database ]; then
    if [ -z "$session" ]; then # no program wrote a session: a file with the store's application_id stands in
        app_id_hex=$(sed -n 's/.*sessionApplicationId = 0x\([0-9A-Fa-f]*\)u.*/\1/p' "$source_dir/core/SessionSchema.h")
        session=$work/cwd/unit-12
        sqlite3 "$session" "PRAGMA application_id = $((16#$app_id_hex)); CREATE TABLE t(x);"
    fi
    type=$(run gio info -a standard::content-type "$session" | sed -n 's/.*content-type: //p')
    [ "$type" = application/x-sagline-session ] && pass "the system MIME database types $(basename "$session") as $type" \
        || fail "$session is '$type' in the system MIME database, not application/x-sagline-session"
fi
if has_program sagline && [ -f /usr/share/applications/mimeinfo.cache ]; then
    grep -q "^application/x-sagline-session=.*$app_id.desktop" /usr/share/applications/mimeinfo.cache \
        && pass "session files open with $app_id.desktop" \
        || fail "mimeinfo.cache does not associate application/x-sagline-session with $app_id.desktop"
fi
for program in "${programs[@]}"; do
    man_page=$(run man -w "$program" 2>/dev/null || true)
    [ "$man_page" = "/usr/share/man/man1/$program.1.gz" ] && pass "man $program finds $man_page" \
        || fail "man -w $program gave '$man_page'"
done

# --- Remove ----------------------------------------------------------------------------------
echo "== dpkg -P"
dpkg -P "$package" >"$work/dpkg-p.log" 2>&1 || { cat "$work/dpkg-p.log" >&2; fail "dpkg -P failed"; }
installed_by_us=0
left=0
while read -r path; do
    if grep -qxF "$path" "$work/existed-before"; then
        # A folder shared with other packages (/usr/bin, /usr/share/man/man1, ...) must stay.
        [ -e "$path" ] || fail "dpkg -P removed $path, which existed before the install"
    elif [ -e "$path" ] || [ -L "$path" ]; then
        fail "left behind after purge: $path"
        left=$((left + 1))
    fi
done <"$work/dpkg-list"
[ "$left" -eq 0 ] && pass "nothing of the $(wc -l <"$work/dpkg-list") paths dpkg listed is left"
[ ! -e /usr/share/mime/application/x-sagline-session.xml ] && pass "MIME database no longer has the session type" \
    || fail "/usr/share/mime/application/x-sagline-session.xml is left after purge"
if [ -f /usr/share/applications/mimeinfo.cache ]; then
    ! grep -q "$app_id" /usr/share/applications/mimeinfo.cache && pass "mimeinfo.cache no longer names $app_id" \
        || fail "mimeinfo.cache still names $app_id after purge"
fi

if [ "$failures" -ne 0 ]; then
    echo "$failures check(s) failed" >&2
    exit 1
fi
echo "package built, checked, installed, run and removed cleanly"

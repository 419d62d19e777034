# Builds the hostile-input corpus used by HostileInputTests (run with any python3).
# Each case is a folder holding responses.csv, codebook.csv and expect.txt:
#   line 1: expected exit code; further lines: fragments the one-line message (exit 2)
#   or summary.json (exit 0, documented recovery) must contain.
import os, random, shutil

random.seed(20261202)
HERE = os.path.dirname(os.path.abspath(__file__))
ITEMS = ["q1", "q2", "q3", "q4", "q5", "q6"]
CODEBOOK = "item,subscale,reverse,min,max,text\n" + "".join(
    f"q{j},{'A' if j <= 3 else 'B'},{'true' if j == 3 else 'false'},1,5,Item {j}\n" for j in range(1, 7))

def rows(n=40, items=ITEMS):
    out = []
    for i in range(n):
        base = random.randint(1, 5)
        out.append([f"id{i+1}"] + [str(min(5, max(1, base + random.randint(-1, 1)))) for _ in items])
    return out

def csv(header, body, sep=",", nl="\n"):
    return nl.join(sep.join(r) for r in [header] + body) + nl

def case(name, responses, expect, codebook=CODEBOOK, encoding="utf-8", raw=None, raw_codebook=None):
    d = os.path.join(HERE, name)
    shutil.rmtree(d, ignore_errors=True)
    os.makedirs(d)
    with open(os.path.join(d, "responses.csv"), "wb") as f:
        f.write(raw if raw is not None else responses.encode(encoding))
    with open(os.path.join(d, "codebook.csv"), "wb") as f:
        f.write(raw_codebook if raw_codebook is not None else codebook.encode("utf-8"))
    with open(os.path.join(d, "expect.txt"), "w", encoding="utf-8") as f:
        f.write("\n".join(str(e) for e in expect) + "\n")

H = ["respondent"] + ITEMS
good = rows()
case("empty-file", "", [2, "line 1", "empty"])
case("header-only", csv(H, []), [2, "line 2", "no data rows"])
case("utf8-bom", "\ufeff" + csv(H, good), [0, '"total": 40'])
case("utf16-bom", csv(H, good), [0, '"total": 40'], encoding="utf-16")
case("semicolon", csv(H, good, ";"), [0, '"total": 40'])
case("tab", csv(H, good, "\t"), [0, '"total": 40'])
case("crlf-line-ends", csv(H, good, ",", "\r\n"), [0, '"total": 40'])
b = [r[:] for r in good]; b[2][0] = '"three\nlines\nid"'; b[5][4] = "x"
case("quoted-newlines-then-bad-cell", csv(H, b), [2, "line 9", '"q4"', '"x"'])
b = [r[:] for r in good]; b[10] = b[10] + ["5"]
case("ragged-row", csv(H, b), [2, "line 12", "8 fields", "header has 7"])
case("duplicate-columns", csv(H + ["q2"], [r + ["3"] for r in good]), [2, "line 1", '"q2"', "appears twice"])
b = [r[:] for r in good]; b[7][0] = "id1"
case("duplicate-ids", csv(H, b), [2, "line 9", '"id1"', "line 2"])
for name, value in [("non-numeric", "agree"), ("nan-text", "NaN"), ("infinity-text", "Infinity"), ("huge-number", "1e308"), ("out-of-range", "7")]:
    b = [r[:] for r in good]; b[20][2] = value
    case(name, csv(H, b), [2, "line 22", '"q2"', f'"{value}"'])
case("codebook-absent-column", csv(H, good), [2, "codebook.csv", "line 8", '"q7"'],
     codebook=CODEBOOK + "q7,B,false,1,5,Item 7\n")
case("codebook-inverted-range", csv(H, good), [2, "codebook.csv", "line 3", "must be below max"],
     codebook=CODEBOOK.replace("q2,A,false,1,5", "q2,A,false,5,1"))
case("codebook-unknown-reverse-flag", csv(H, good), [2, "codebook.csv", "line 4", '"maybe"'],
     codebook=CODEBOOK.replace("q3,A,true", "q3,A,maybe"))
b = [r[:] for r in good]
for r in b: r[5] = "4"
case("zero-variance-item", csv(H, b), [0, '"zero-variance"', '"q5"'])
b = [r[:] for r in good]
for r in b: r[6] = "NA"
case("all-missing-item", csv(H, b), [0, '"all-missing"', '"q6"'])
b = [r[:] for r in good]; b[3] = [b[3][0]] + [""] * 6
case("respondent-with-no-answers", csv(H, b), [0, '"mostly-unanswered": 1', "answered none of the items"])
case("fewer-respondents-than-items", csv(H, rows(5)), [2, "5 respondents", "at least 10"])
b = [r[:] for r in good]
for r in b: r[2] = r[1]
case("singular-correlation-matrix", csv(H, b), [0, '"smoothed": true', "not positive definite"])
b = [r[:] for r in good]; b[1][0] = "x" * 300000
case("very-long-line", csv(H, b), [0, '"total": 40'])
b = [r[:] for r in good]; b[4][0] = '"=HYPERLINK(""http://x"")"'
case("formula-like-id", csv(H, b), [0, '"total": 40'])
case("not-utf8", None, [2, "line 1", "not valid UTF-8"], raw=b"respondent,q1\xff\xfe\x00,q2\n")
b = [r[:] for r in good]; b[8][3] = '3"'
case("stray-quote", csv(H, b), [2, "line 10"])

# --- Data-safety cases (exit 0 cases also get the generic output checks of HostileInputTests:
# no raw control characters in any CSV, tables.md inert, short-form-codebook.csv accepted back by check) ---
b = [r[:] for r in good]; b[6][0] = '"two\nline id"'; b[7][0] = "nul\x00id"
case("ids-with-newline-and-nul", csv(H, b), [0, '"total": 40'])
# An invalid byte far beyond the first read block: the message must name its true line (4,002).
big = rows(4500)
text = csv(H, big).encode("utf-8")
lines = text.split(b"\n")
lines[4001] = lines[4001].replace(b",", b",\xc3\x28", 1)
case("not-utf8-late-line", None, [2, "line 4002", "not valid UTF-8"], raw=b"\n".join(lines))
cb_bad = CODEBOOK.encode("utf-8").split(b"\n")
cb_bad[3] = cb_bad[3].replace(b"Item", b"It\xffem")
case("codebook-not-utf8", csv(H, good), [2, "codebook.csv", "line 4", "not valid UTF-8"], raw_codebook=b"\n".join(cb_bad))
case("utf16-without-bom", None, [2, "line 1", "UTF-16", "byte-order mark"], raw=csv(H, good).encode("utf-16-le"))
for name, value, shown in [("bom-in-cell", "\ufeff3", "\\uFEFF3"), ("zero-width-space-in-cell", "4\u200b", "4\\u200B"),
                           ("nul-in-cell", "\x002", "\\u00002")]:
    b = [r[:] for r in good]; b[11][4] = value
    case(name, csv(H, b), [2, "line 13", '"q4"', shown])
# Codebook names that Markdown, HTML or a spreadsheet would act on.
ACTIVE = ["<script>alert(1)</script>", "[x](javascript:alert(1))", "*star*", "_under_", "`tick`", "<img src=x onerror=alert(1)>"]
SUBS = ["=cmd", "@at", "+plus", "-minus"]
def q(s): return '"' + s.replace('"', '""') + '"' if any(c in s for c in ',"\n') else s
cb = "item,subscale,reverse,min,max,text\n" + "".join(
    f"{q(name)},{q(SUBS[j % 2])},false,1,5,{q('Wording ' + name)}\n" for j, name in enumerate(ACTIVE))
hdr = ["respondent"] + [q(n) for n in ACTIVE]
body = []
for i in range(60):
    base = random.randint(1, 5)
    body.append([f"r{i+1}"] + [str(min(5, max(1, base + random.randint(-1, 1)))) for _ in ACTIVE])
case("markdown-and-formula-names", csv(hdr, body), [0, '"total": 60'], codebook=cb)

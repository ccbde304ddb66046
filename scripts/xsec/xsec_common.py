"""Pieces shared by the cross-section scripts of this folder (he_set.py, o2_sets.py,
n2_sets.py): reading a set in the community text format, the solver's interpolation, the
elastic cross section made from a distributed total (effective) one, and writing a process
block of n2pulse's own format (version 1; described in data/xsec-o2.txt)."""

KINDS = ("EFFECTIVE", "ELASTIC", "EXCITATION", "IONIZATION", "ATTACHMENT")


def parse_community(text, kinds=KINDS):
    """Return the processes of a community-format text as dicts (kind, product, param, data).

    A block is a kind line, a species line ("X -> Y"), an optional parameter line (threshold
    or mass ratio; absent for attachment), any comment lines, then a table between two lines
    of dashes."""
    lines = text.split("\n")
    out, i = [], 0
    while i < len(lines):
        kind = lines[i].strip()
        if kind not in kinds:
            i += 1
            continue
        product = lines[i + 1].split("->")[-1].strip()
        j = i + 2
        param = 0.0
        if not lines[j].startswith("-----") and _is_number(lines[j].split()[0]):
            param = float(lines[j].split()[0])
            j += 1
        while not lines[j].startswith("-----"):
            j += 1
        j += 1
        data = []
        while not lines[j].startswith("-----"):
            e, s = lines[j].split()
            data.append((float(e), float(s)))
            j += 1
        es = [e for e, _ in data]
        assert es == sorted(es) and len(set(es)) == len(es), product
        out.append({"kind": kind, "product": product, "param": param, "data": data})
        i = j + 1
    return out


def _is_number(word):
    try:
        float(word)
    except ValueError:
        return False
    return True


def interp(data, e):
    """The solver's interpolation: zero below the first point, linear inside, last value beyond."""
    if e < data[0][0]:
        return 0.0
    for (e0, s0), (e1, s1) in zip(data, data[1:]):
        if e0 <= e <= e1:
            return s0 + (s1 - s0) * (e - e0) / (e1 - e0)
    return data[-1][1]


def elastic_from_effective(effective, inelastic):
    """Elastic momentum transfer = the distributed total (effective) one minus every inelastic
    process, on the union of their energy grids (exact for the solver's linear interpolation)."""
    grid = sorted({e for p in [effective] + inelastic for e, _ in p["data"]})
    elastic = []
    for e in grid:
        s = interp(effective["data"], e) - sum(interp(p["data"], e) for p in inelastic)
        assert s > 0, (e, s)
        elastic.append((e, s))
    return elastic


def block(kind, name, label, threshold, source, data):
    """One process block of n2pulse's cross-section format."""
    s = ["process", "kind " + kind, "name " + name]
    if label:
        s.append("label " + label)
    s.append("threshold_eV %g" % threshold)
    s.append("source " + source)
    s.append("data")
    s += ["%.7g %.6g" % (e, x) for e, x in data]
    s.append("end")
    return "\n".join(s) + "\n"


def write_from_effective(path, header, text, count, sources):
    """Write a set distributed with a total (effective) momentum-transfer cross section as
    n2pulse's format: the first process of the community-format text must be the effective
    one, turned into elastic momentum transfer (elastic_from_effective); count is the number
    of processes expected; sources maps each product to (kind, name, label, source). An
    attachment process gets threshold 0 (the community format gives it no energy loss)."""
    procs = parse_community(text)
    assert len(procs) == count, len(procs)
    eff, inel = procs[0], procs[1:]
    assert eff["kind"] == "EFFECTIVE"
    elastic = elastic_from_effective(eff, inel)
    body = [header]
    for p in procs:
        kind, name, label, source = sources[p["product"]]
        if p["kind"] == "EFFECTIVE":
            body.append(block(kind, name, label, 0, source, elastic))
            continue
        thr = 0 if p["kind"] == "ATTACHMENT" else p["param"]
        body.append(block(kind, name, label, thr, source, p["data"]))
    with open(path, "w") as fh:
        fh.write("\n".join(body))

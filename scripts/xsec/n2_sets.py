#!/usr/bin/env python3
"""Write n2pulse's N2 cross-section sets data/xsec-n2-phelps.txt and data/xsec-n2-itikawa.txt.

Run once; its output is committed. The Go code never reads the community format.

Input: the N2 set of A.V. Phelps & L.C. Pitchford, Phys. Rev. A 31, 2932 (1985), in the community
text format (blocks ELASTIC / EXCITATION / IONIZATION, a species line, a threshold or mass-ratio
line, comment lines, then a table between lines of dashes). The copy read was
tests/test_data/N2_Phelps.txt of the public repository avadean/lxcat_data_parser (commit
b0b59d1); its data blocks were transcribed by hand into the file given as the argument.

Output 1, "phelps1985": every process of that set as distributed, one block each, named by the
state it excites and with the primary publication the set's comment names.
Output 2, "itikawa2006": the same set with B3Pi_g and C3Pi_u replaced by the recommended cross
sections of Y. Itikawa, J. Phys. Chem. Ref. Data 35, 31 (2006), Tables 8 and 10 (values below,
from a public transcription of those tables; its C3Pi_u peak, 5.83e-21 m2 at 14.5 eV, is the
one issue 14 quotes from the paper; its B3Pi_g peak, 3.39e-21 m2 at 12.5 eV, is 6 % above the
older compilation in data/xsec-n2.txt, 3.2e-21 m2 at 12.5 eV). Itikawa's tables end at 50 eV; above that the Phelps set's shape is used,
scaled to meet Itikawa's value at 50 eV (our choice, stated in the file).

usage: python3 scripts/xsec/n2_sets.py N2_Phelps.txt data/
"""
import sys

from xsec_common import block

PP85 = "A.V. Phelps & L.C. Pitchford, Phys. Rev. A 31, 2932 (1985)"
CARTWRIGHT = "D.C. Cartwright, A. Chutjian, S. Trajmar & W. Williams, Phys. Rev. A 16, 1013 (1977)"
SCHULZ = "G.J. Schulz, Phys. Rev. 135, A988 (1964)"
ITIKAWA = "Y. Itikawa, J. Phys. Chem. Ref. Data 35, 31 (2006)"

# product in the community file -> (kind, our name, label, primary source)
PROCESSES = {
    "N2": ("elastic", "N2 elastic momentum transfer", "", PP85 + " (momentum-transfer cross section of the set)"),
    "N2(rot)": ("excitation", "N2 -> N2(rotation, single-level approximation)", "rot",
                "single-level approximation to rotational excitation, R.D. Hake & A.V. Phelps, Phys. Rev. 158, 70 (1967) (page from memory; the distributed file prints 60); as compiled in " + PP85),
    "N2(v1)": ("excitation", "N2(X,v=0) -> N2(v=1)", "vib1",
               "A.G. Engelhardt, A.V. Phelps & C.G. Risk, Phys. Rev. 135, A1566 (1964) below 1.6 eV, non-resonant part above; as compiled in " + PP85),
    "N2(v1res)": ("excitation", "N2(X,v=0) -> N2(v=1 resonant)", "vib1res", SCHULZ + " (2.3 eV resonance); as compiled in " + PP85),
    "N2(A3,v0-4)": ("excitation", "N2(X) -> N2(A3Sigma_u+ v0 to 4)", "A", CARTWRIGHT + "; as compiled in " + PP85),
    "N2(A3,v5-9)": ("excitation", "N2(X) -> N2(A3Sigma_u+ v5 to 9)", "A", CARTWRIGHT + "; as compiled in " + PP85),
    "N2(A3,v10-)": ("excitation", "N2(X) -> N2(A3Sigma_u+ v10 and up)", "A", CARTWRIGHT + "; as compiled in " + PP85),
    "N2(B3)": ("excitation", "N2(X) -> N2(B3Pi_g)", "B", CARTWRIGHT + "; as compiled in " + PP85),
    "N2(W3)": ("excitation", "N2(X) -> N2(W3Delta_u)", "W", CARTWRIGHT + "; as compiled in " + PP85),
    "N2(B'3)": ("excitation", "N2(X) -> N2(B'3Sigma_u-)", "Bp", CARTWRIGHT + "; as compiled in " + PP85),
    "N2(a'1)": ("excitation", "N2(X) -> N2(a'1Sigma_u-)", "", PP85),
    "N2(a1)": ("excitation", "N2(X) -> N2(a1Pi_g)", "", PP85),
    "N2(w1)": ("excitation", "N2(X) -> N2(w1Delta_u)", "", CARTWRIGHT + "; as compiled in " + PP85),
    "N2(C3)": ("excitation", "N2(X) -> N2(C3Pi_u)", "C",
               CARTWRIGHT + ", near threshold after Finn & Kisker, scaled by Phelps; as compiled in " + PP85),
    "N2(E3)": ("excitation", "N2(X) -> N2(E3Sigma_g+)", "", CARTWRIGHT + "; as compiled in " + PP85),
    "N2(a''1)": ("excitation", "N2(X) -> N2(a''1Sigma_g+)", "", PP85),
    "N2(SUM)": ("excitation", "N2(X) -> sum of higher singlet states", "singlets",
                "E.C. Zipf & R.W. McLaughlin, Planet. Space Sci. 26, 449 (1978); as compiled in " + PP85),
    "N2^+": ("ionisation", "N2 -> N2+ (counting ionisation)", "ion",
             "D. Rapp & P. Englander-Golden, J. Chem. Phys. 43, 1464 (1965); as compiled in " + PP85),
    "N2^+(B2SIGMA)": ("ionisation", "N2 -> N2+(B2Sigma_u+)", "ion_B",
                      "W.L. Borst & E.C. Zipf, Phys. Rev. A 1, 834 (1970); a second ionisation channel as the distributed set gives it"),
}
for v in range(2, 9):
    PROCESSES["N2(v%d)" % v] = ("excitation", "N2(X,v=0) -> N2(v=%d)" % v, "vib%d" % v, SCHULZ + "; as compiled in " + PP85)

# Itikawa 2006, Table 8 (B3Pi_g) and Table 10 (C3Pi_u): energy [eV], cross section [1e-16 cm2].
ITIKAWA_B = [(7.353, 0), (8.55, 0.002), (9, 0.141), (9.5, 0.202), (10, 0.250), (10.5, 0.287), (11, 0.313),
             (11.5, 0.330), (12, 0.338), (12.5, 0.339), (13, 0.333), (13.5, 0.323), (14, 0.308),
             (14.5, 0.290), (15, 0.270), (16, 0.224), (17, 0.199), (18, 0.177), (19, 0.159), (20, 0.144),
             (25, 0.092), (30, 0.064), (35, 0.049), (40, 0.036), (45, 0.028), (50, 0.023)]
# The transcription's first C point is 0.001 at 11.0 eV, below the 11.032 eV threshold: taken at
# the threshold as zero.
ITIKAWA_C = [(11.032, 0), (11.5, 0.074), (12, 0.147), (12.5, 0.229), (13, 0.335), (13.5, 0.455),
             (14, 0.551), (14.5, 0.583), (15, 0.551), (15.7, 0.478), (16, 0.447), (16.5, 0.403),
             (17, 0.353), (17.5, 0.302), (18, 0.276), (18.5, 0.258), (19, 0.242), (19.5, 0.226),
             (20, 0.212), (25, 0.122), (30, 0.077), (35, 0.052), (40, 0.038), (45, 0.028), (50, 0.022)]


def parse(path):
    """Return the processes of a community-format file as dicts."""
    lines = open(path).read().split("\n")
    out, i = [], 0
    while i < len(lines):
        kind = lines[i].strip()
        if kind not in ("ELASTIC", "EXCITATION", "IONIZATION"):
            i += 1
            continue
        species = lines[i + 1].strip()
        product = species.split("->")[-1].strip()
        param = float(lines[i + 2].split()[0])
        j = i + 3
        while not lines[j].startswith("-----"):
            j += 1
        j += 1
        data = []
        while not lines[j].startswith("-----"):
            e, s = lines[j].split()
            data.append((float(e), float(s)))
            j += 1
        out.append({"kind": kind, "product": product, "param": param, "data": data})
        i = j + 1
    return out




def tail(phelps, itikawa_si):
    """Itikawa's points, then the Phelps points above 50 eV scaled to meet Itikawa at 50 eV."""
    p50 = dict(phelps)[50.0]
    f = itikawa_si[-1][1] / p50
    return itikawa_si + [(e, x * f) for e, x in phelps if e > 50], f


HEADER = """# n2pulse electron-impact cross-section set: N2, set "%s"
# Format (n2pulse's own, version 1): see data/xsec-n2.txt. Made by scripts/xsec/n2_sets.py (run
# once; this file is its output). %s
# Not included: superelastic collisions (negligible excited populations at 300 K).
format n2pulse-xsec 1
species N2
mass_amu 28.0134
"""


def main():
    src, outdir = sys.argv[1], sys.argv[2].rstrip("/")
    procs = parse(src)
    assert len(procs) == 26, len(procs)
    for setname, fname, what in (
            ("phelps1985", "xsec-n2-phelps.txt",
             "The N2 set of " + PP85 + " as distributed in the community text format (the "
             "distributed copy notes that the C state was rescaled and the ionisation split in two "
             "channels; both kept as given), every process with the primary publication it names. "
             "The set was derived together with swarm measurements (drift velocity, "
             "characteristic energy, alpha/N) in N2."),
            ("itikawa2006", "xsec-n2-itikawa.txt",
             "The phelps1985 set with B3Pi_g and C3Pi_u replaced by the recommended cross sections of "
             + ITIKAWA + ", Tables 8 and 10.")):
        body = [HEADER % (setname, what)]
        for p in procs:
            kind, name, label, source = PROCESSES[p["product"]]
            thr = 0 if p["kind"] == "ELASTIC" else p["param"]
            data = p["data"]
            if setname == "itikawa2006" and p["product"] in ("N2(B3)", "N2(C3)"):
                tab = ITIKAWA_B if p["product"] == "N2(B3)" else ITIKAWA_C
                si = [(e, x * 1e-20) for e, x in tab]
                data, f = tail(p["data"], si)
                thr = tab[0][0]
                table = "Table 8" if p["product"] == "N2(B3)" else "Table 10"
                source = ("%s, %s (recommended values), up to 50 eV, read in a public "
                          "transcription of the table; above 50 eV the %s shape times %.4f, which meets "
                          "Itikawa's 50 eV value (our choice; the table ends there)" % (ITIKAWA, table, PP85, f))
            body.append(block(kind, name, label, thr, source, data))
        with open(outdir + "/" + fname, "w") as fh:
            fh.write("\n".join(body))


if __name__ == "__main__":
    main()

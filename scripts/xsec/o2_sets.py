#!/usr/bin/env python3
"""Write n2pulse's O2 cross-section set data/xsec-o2-phelps.txt.

Run once; its output is committed. The Go code never reads the community format.

Input: the O2 set of A.V. Phelps's compilation in the community text format (blocks EFFECTIVE /
EXCITATION / IONIZATION / ATTACHMENT, a species line, a mass-ratio or threshold line, then a
table between lines of dashes). The copy read was the O2 section ("From compilation of A. V.
Phelps.") of the file bolsigdb.dat in the public repository seth303/ArrheniusRates (commit
fd2d896; an export of the LXCat Phelps database dated 10 Nov 2011). Its data blocks were
transcribed by hand into TRANSCRIPT below; the comment and date lines of each block are left
out there and their content kept in SOURCES. The three-body attachment block of that copy
(density-normalised, e + O2 + O2) is left out: the solver adds three-body attachment as a rate
(kinetics/swarm doc.go).

The set is the one derived, together with swarm measurements in O2 (drift velocity,
characteristic energy, attachment and ionisation coefficients), by S.A. Lawton & A.V. Phelps,
J. Chem. Phys. 69, 1055 (1978), as later tabulated by Phelps; the file read names only "From
compilation of A. V. Phelps" and, for the vibrational processes, the measurements it used.

The file gives the total (effective) momentum-transfer cross section. n2pulse's format holds the
elastic momentum transfer, the solver adding every inelastic process back (kinetics/swarm
doc.go); so the elastic cross section written is

    sigma_elastic(e) = sigma_effective(e) - sum of the inelastic cross sections at e,

evaluated on the union of all the energies of the set, which is exact for the piecewise-linear
interpolation the solver uses.

usage: python3 scripts/xsec/o2_sets.py data/
"""
import sys

from xsec_common import write_from_effective

PHELPS = ("compilation of A.V. Phelps (the O2 set of S.A. Lawton & A.V. Phelps, J. Chem. Phys. 69, "
          "1055 (1978); the file read names only the compilation), read in the community-format "
          "copy in the public repository seth303/ArrheniusRates, bolsigdb.dat")
LINDER = "F. Linder & H. Schmidt, Z. Naturforsch. 26a, 1617 (1971) (the file read says 'Linder and Schmidt'; reference from memory)"
WONG = ("the 9 eV resonance of S.F. Wong, M.J.W. Boness & G.J. Schulz, Phys. Rev. Lett. 31, 969 (1973), "
        "normalised to S. Trajmar, D.C. Cartwright & W. Williams, Phys. Rev. A 4, 1482 (1971) (the file read "
        "says 'Wong et al, normalized to Trajmar et al'; references from memory)")

# product in the community file -> (kind, our name, label, source)
SOURCES = {
    "O2": ("elastic", "O2 elastic momentum transfer", "",
           "effective (total) momentum transfer of the " + PHELPS + ", minus the sum of the set's "
           "inelastic cross sections (derived by scripts/xsec/o2_sets.py); mass ratio in the file 1.7e-5"),
    "O2(rot)": ("excitation", "O2 -> O2(rotation, single-level approximation)", "rot",
                "single-level approximation to the peaked rotational excitation at 300 K (as the file "
                "read describes it); " + PHELPS),
    "O2(v1)": ("excitation", "O2(X,v=0) -> O2(v=1)", "vib1", LINDER + ", with split peak; " + PHELPS),
    "O2(v1res)": ("excitation", "O2(X,v=0) -> O2(v=1 9 eV resonance)", "vib1res", WONG + "; " + PHELPS),
    "O2(v2)": ("excitation", "O2(X,v=0) -> O2(v=2)", "vib2", LINDER + "; " + PHELPS),
    "O2(v2res)": ("excitation", "O2(X,v=0) -> O2(v=2 9 eV resonance)", "vib2res", WONG + "; " + PHELPS),
    "O2(v3)": ("excitation", "O2(X,v=0) -> O2(v=3)", "vib3", LINDER + ", with " + WONG + "; " + PHELPS),
    "O2(v4)": ("excitation", "O2(X,v=0) -> O2(v=4)", "vib4", LINDER + ", with " + WONG + "; " + PHELPS),
    "O2(a1D)": ("excitation", "O2(X) -> O2(a1Delta_g)", "a", PHELPS),
    "O2(b1)": ("excitation", "O2(X) -> O2(b1Sigma_g+)", "b", PHELPS),
    "O2(4.5eV)": ("excitation", "O2(X) -> 4.5 eV states", "", "4.5 eV energy loss (A3Sigma_u+, A'3Delta_u, c1Sigma_u-); " + PHELPS),
    "O2(6.0eV)": ("excitation", "O2(X) -> 6.0 eV states", "", "6.0 eV energy loss (dissociation into O(3P) + O(3P)); " + PHELPS),
    "O2(8.4eV)": ("excitation", "O2(X) -> 8.4 eV states", "", "8.4 eV energy loss (B3Sigma_u-, dissociating into O(3P) + O(1D)); " + PHELPS),
    "O2(9.97eV)": ("excitation", "O2(X) -> 9.97 eV states", "", "9.97 eV energy loss (higher states, dissociating into O + O(1S)); " + PHELPS),
    "O2^+": ("ionisation", "O2 -> O2+ (counting ionisation)", "ion", PHELPS + " (the file names no measurement)"),
    "O^- + O": ("attachment", "e + O2 -> O- + O (dissociative attachment)", "att",
                "two-body dissociative attachment; " + PHELPS + " (the file names no measurement)"),
}

# Transcription of the data blocks of the file read (see the module doc string).
TRANSCRIPT = """
EFFECTIVE
O2
  1.700e-5 / mass ratio
------------------------------------------------------------
 0.0000e+0	3.5000e-21
 1.0000e-3	3.5000e-21
 2.0000e-3	3.6000e-21
 3.0000e-3	4.0000e-21
 5.0000e-3	5.0000e-21
 7.0000e-3	5.8000e-21
 8.5000e-3	6.4000e-21
 1.0000e-2	7.0000e-21
 1.5000e-2	8.7000e-21
 2.0000e-2	9.9000e-21
 3.0000e-2	1.2400e-20
 4.0000e-2	1.4400e-20
 5.0000e-2	1.6000e-20
 7.0000e-2	2.1000e-20
 1.0000e-1	2.5000e-20
 1.2000e-1	2.8000e-20
 1.5000e-1	3.1000e-20
 1.7000e-1	3.3000e-20
 2.0000e-1	3.6000e-20
 2.5000e-1	4.1000e-20
 3.0000e-1	4.5000e-20
 3.5000e-1	4.7000e-20
 4.0000e-1	5.2000e-20
 5.0000e-1	5.7000e-20
 7.0000e-1	6.1000e-20
 1.0000e+0	7.2000e-20
 1.2000e+0	7.9000e-20
 1.3000e+0	7.9000e-20
 1.5000e+0	7.6000e-20
 1.7000e+0	7.3000e-20
 1.9000e+0	6.9000e-20
 2.1000e+0	6.6000e-20
 2.2000e+0	6.5000e-20
 2.5000e+0	6.1000e-20
 2.8000e+0	5.8000e-20
 3.0000e+0	5.7000e-20
 3.3000e+0	5.5000e-20
 3.6000e+0	5.4500e-20
 4.0000e+0	5.5000e-20
 4.5000e+0	5.5500e-20
 5.0000e+0	5.6000e-20
 6.0000e+0	6.0000e-20
 7.0000e+0	6.6000e-20
 8.0000e+0	7.1000e-20
 1.0000e+1	8.0000e-20
 1.2000e+1	8.5000e-20
 1.5000e+1	8.8000e-20
 1.7000e+1	8.7000e-20
 2.0000e+1	8.6000e-20
 2.5000e+1	8.2000e-20
 3.0000e+1	8.0000e-20
 5.0000e+1	7.7000e-20
 7.5000e+1	6.8000e-20
 1.0000e+2	6.5000e-20
 1.5000e+2	6.7000e-20
 2.0000e+2	6.0000e-20
 3.0000e+2	4.9000e-20
 5.0000e+2	3.6000e-20
 7.0000e+2	2.9000e-20
 1.0000e+3	2.1200e-20
 1.5000e+3	1.4800e-20
 2.0000e+3	1.1400e-20
 3.0000e+3	7.9000e-21
 5.0000e+3	5.1000e-21
 7.0000e+3	3.8000e-21
 1.0000e+4	2.8000e-21
------------------------------------------------------------

EXCITATION
O2 -> O2(rot)
  2.000e-2 / threshold energy
------------------------------------------------------------
 7.0000e-2	 0.0000e+0
 8.0000e-2	5.4000e-23
 1.0000e-1	 0.0000e+0
 2.0000e-1	 0.0000e+0
 2.1000e-1	2.1600e-22
 2.2000e-1	 0.0000e+0
 3.2000e-1	 0.0000e+0
 3.3000e-1	3.8400e-22
 3.5000e-1	 0.0000e+0
 4.4000e-1	 0.0000e+0
 4.5000e-1	5.4000e-22
 4.7000e-1	 0.0000e+0
 5.6000e-1	 0.0000e+0
 5.7000e-1	6.7200e-22
 5.9000e-1	 0.0000e+0
 6.8000e-1	 0.0000e+0
 6.9000e-1	8.0400e-22
 7.1000e-1	 0.0000e+0
 7.9000e-1	 0.0000e+0
 8.0000e-1	9.3600e-22
 8.1000e-1	 0.0000e+0
 9.0000e-1	 0.0000e+0
 9.1000e-1	8.4000e-22
 9.3000e-1	 0.0000e+0
 1.0200e+0	 0.0000e+0
 1.0300e+0	7.2000e-22
 1.0500e+0	 0.0000e+0
 1.1300e+0	 0.0000e+0
 1.1400e+0	4.6800e-22
 1.1600e+0	 0.0000e+0
 1.2200e+0	 0.0000e+0
 1.2300e+0	6.0000e-22
 1.2600e+0	 0.0000e+0
 1.3400e+0	 0.0000e+0
 1.3500e+0	3.6000e-22
 1.3700e+0	 0.0000e+0
 1.4400e+0	 0.0000e+0
 1.4500e+0	2.4000e-22
 1.4700e+0	 0.0000e+0
 1.5400e+0	 0.0000e+0
 1.5500e+0	1.2000e-22
 1.5700e+0	 0.0000e+0
 1.6400e+0	 0.0000e+0
 1.6500e+0	4.8000e-23
 1.6700e+0	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(v1)
  1.900e-1 / threshold energy
------------------------------------------------------------
 0.0000e+0	 0.0000e+0
 1.9000e-1	 0.0000e+0
 2.0000e-1	1.0000e-23
 2.1000e-1	1.0000e-23
 2.3000e-1	 0.0000e+0
 3.2000e-1	 0.0000e+0
 3.3000e-1	4.1500e-21
 3.5000e-1	 0.0000e+0
 4.4000e-1	 0.0000e+0
 4.5000e-1	1.3500e-20
 4.7000e-1	 0.0000e+0
 5.6000e-1	 0.0000e+0
 5.7000e-1	1.8500e-20
 5.9000e-1	 0.0000e+0
 6.8000e-1	 0.0000e+0
 6.9000e-1	1.6500e-20
 7.1000e-1	 0.0000e+0
 7.9000e-1	 0.0000e+0
 8.0000e-1	1.0000e-20
 8.2000e-1	 0.0000e+0
 9.0000e-1	 0.0000e+0
 9.1000e-1	6.0000e-21
 9.3000e-1	 0.0000e+0
 1.0200e+0	 0.0000e+0
 1.0300e+0	2.8500e-21
 1.0500e+0	 0.0000e+0
 1.1300e+0	 0.0000e+0
 1.1400e+0	1.1250e-21
 1.1600e+0	 0.0000e+0
 1.2300e+0	 0.0000e+0
 1.2400e+0	4.7500e-22
 1.2600e+0	 0.0000e+0
 1.3400e+0	 0.0000e+0
 1.3500e+0	1.6500e-22
 1.3700e+0	 0.0000e+0
 1.4400e+0	 0.0000e+0
 1.4500e+0	5.5000e-23
 1.4700e+0	 0.0000e+0
 1.5400e+0	 0.0000e+0
 1.5500e+0	1.9000e-23
 1.5700e+0	 0.0000e+0
 1.6300e+0	 0.0000e+0
 1.6500e+0	6.0000e-24
 1.6700e+0	 0.0000e+0
 3.5000e+0	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(v1res)
  1.900e-1 / threshold energy
------------------------------------------------------------
 4.0000e+0	 0.0000e+0
 5.0000e+0	4.2000e-22
 6.0000e+0	1.0000e-21
 7.0000e+0	1.7600e-21
 8.0000e+0	2.3100e-21
 9.0000e+0	2.4700e-21
 1.0000e+1	2.3400e-21
 1.1000e+1	1.8600e-21
 1.2000e+1	1.4300e-21
 1.3000e+1	1.0200e-21
 1.4000e+1	7.1000e-22
 1.5000e+1	4.0000e-22
 2.0000e+1	1.0000e-22
 4.5000e+1	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(v2)
  3.800e-1 / threshold energy
------------------------------------------------------------
 0.0000e+0	 0.0000e+0
 3.8000e-1	 0.0000e+0
 4.4000e-1	 0.0000e+0
 4.5000e-1	 0.0000e+0
 4.7000e-1	 0.0000e+0
 5.6000e-1	 0.0000e+0
 5.7000e-1	1.4000e-21
 5.9000e-1	 0.0000e+0
 6.8000e-1	 0.0000e+0
 6.9000e-1	4.1500e-21
 7.1000e-1	 0.0000e+0
 7.9000e-1	 0.0000e+0
 8.0000e-1	5.3500e-21
 8.2000e-1	 0.0000e+0
 9.0000e-1	 0.0000e+0
 9.1000e-1	4.6500e-21
 9.3000e-1	 0.0000e+0
 1.0200e+0	 0.0000e+0
 1.0300e+0	3.1500e-21
 1.0500e+0	 0.0000e+0
 1.1300e+0	 0.0000e+0
 1.1400e+0	2.0000e-21
 1.1600e+0	 0.0000e+0
 1.2300e+0	 0.0000e+0
 1.2400e+0	9.5000e-22
 1.2600e+0	 0.0000e+0
 1.3400e+0	 0.0000e+0
 1.3500e+0	4.0000e-22
 1.3700e+0	 0.0000e+0
 1.4400e+0	 0.0000e+0
 1.4500e+0	1.8500e-22
 1.4700e+0	 0.0000e+0
 1.5400e+0	 0.0000e+0
 1.5500e+0	8.5000e-23
 1.5700e+0	 0.0000e+0
 1.6300e+0	 0.0000e+0
 1.6500e+0	3.4000e-23
 1.6700e+0	 0.0000e+0
 3.5000e+0	 0.0000e+0
 4.0000e+0	 0.0000e+0
 5.0000e+0	 0.0000e+0
 1.0000e+4	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(v2res)
  3.800e-1 / threshold energy
------------------------------------------------------------
 4.0000e+0	 0.0000e+0
 5.0000e+0	2.8000e-22
 6.0000e+0	4.0000e-22
 7.0000e+0	7.3000e-22
 8.0000e+0	9.4000e-22
 9.0000e+0	1.1000e-21
 1.0000e+1	1.0900e-21
 1.1000e+1	9.3000e-22
 1.2000e+1	7.3000e-22
 1.3000e+1	5.1000e-22
 1.4000e+1	2.8000e-22
 1.5000e+1	1.3000e-22
 2.0000e+1	5.0000e-23
 4.5000e+1	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(v3)
  5.700e-1 / threshold energy
------------------------------------------------------------
 0.0000e+0	 0.0000e+0
 5.7000e-1	 0.0000e+0
 6.8000e-1	 0.0000e+0
 6.9000e-1	3.7000e-23
 7.1000e-1	 0.0000e+0
 7.9000e-1	 0.0000e+0
 8.0000e-1	2.1500e-22
 8.2000e-1	 0.0000e+0
 9.0000e-1	 0.0000e+0
 9.1000e-1	9.0000e-22
 9.3000e-1	 0.0000e+0
 1.0200e+0	 0.0000e+0
 1.0300e+0	1.2000e-21
 1.0500e+0	 0.0000e+0
 1.1300e+0	 0.0000e+0
 1.1400e+0	1.1500e-21
 1.1600e+0	 0.0000e+0
 1.2300e+0	 0.0000e+0
 1.2400e+0	9.5000e-22
 1.2600e+0	 0.0000e+0
 1.3400e+0	 0.0000e+0
 1.3500e+0	5.5000e-22
 1.3700e+0	 0.0000e+0
 1.4400e+0	 0.0000e+0
 1.4500e+0	3.0000e-22
 1.4700e+0	 0.0000e+0
 1.5400e+0	 0.0000e+0
 1.5500e+0	1.6500e-22
 1.5700e+0	 0.0000e+0
 1.6300e+0	 0.0000e+0
 1.6500e+0	8.0000e-23
 1.6700e+0	 0.0000e+0
 3.5000e+0	 0.0000e+0
 4.0000e+0	 0.0000e+0
 5.0000e+0	 0.0000e+0
 6.0000e+0	1.2500e-22
 7.0000e+0	3.6300e-22
 8.0000e+0	5.8800e-22
 9.0000e+0	7.5000e-22
 1.0000e+1	6.7500e-22
 1.1000e+1	5.6300e-22
 1.2000e+1	4.7500e-22
 1.3000e+1	3.0000e-22
 1.4000e+1	1.7500e-22
 1.5000e+1	8.8000e-23
 2.0000e+1	 0.0000e+0
 4.5000e+1	 0.0000e+0
 1.0000e+4	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(v4)
  7.500e-1 / threshold energy
------------------------------------------------------------
 0.0000e+0	 0.0000e+0
 7.5000e-1	 0.0000e+0
 7.9000e-1	 0.0000e+0
 8.0000e-1	1.5000e-23
 8.2000e-1	 0.0000e+0
 9.0000e-1	 0.0000e+0
 9.1000e-1	5.5000e-23
 9.3000e-1	 0.0000e+0
 1.0200e+0	 0.0000e+0
 1.0300e+0	3.0000e-24
 1.0500e+0	 0.0000e+0
 1.1300e+0	 0.0000e+0
 1.1400e+0	1.6500e-22
 1.1600e+0	 0.0000e+0
 1.2300e+0	 0.0000e+0
 1.2400e+0	3.1500e-22
 1.2600e+0	 0.0000e+0
 1.3400e+0	 0.0000e+0
 1.3500e+0	3.3500e-22
 1.3700e+0	 0.0000e+0
 1.4400e+0	 0.0000e+0
 1.4500e+0	2.8500e-22
 1.4700e+0	 0.0000e+0
 1.5400e+0	 0.0000e+0
 1.5500e+0	2.1500e-22
 1.5700e+0	 0.0000e+0
 1.6300e+0	 0.0000e+0
 1.6500e+0	1.6500e-22
 1.6700e+0	 0.0000e+0
 6.0000e+0	 0.0000e+0
 7.0000e+0	2.7500e-22
 8.0000e+0	3.5000e-22
 9.0000e+0	4.1300e-22
 1.0000e+1	4.6200e-22
 1.1000e+1	3.1300e-22
 1.2000e+1	2.5000e-22
 1.3000e+1	1.7500e-22
 1.4000e+1	8.8000e-23
 1.5000e+1	 0.0000e+0
 1.0000e+4	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(a1D)
  9.770e-1 / threshold energy
------------------------------------------------------------
 9.7700e-1	 0.0000e+0
 1.5000e+0	5.8000e-23
 2.0000e+0	1.5300e-22
 3.0000e+0	3.8000e-22
 3.5000e+0	4.9000e-22
 4.0000e+0	5.7000e-22
 5.0000e+0	7.4000e-22
 5.6200e+0	8.2500e-22
 5.9100e+0	8.6200e-22
 6.1900e+0	8.8800e-22
 6.5300e+0	9.0800e-22
 6.9900e+0	9.1400e-22
 7.6100e+0	8.9100e-22
 7.8900e+0	8.6300e-22
 8.9600e+0	7.6800e-22
 1.0040e+1	6.7900e-22
 1.3000e+1	5.2700e-22
 1.5100e+1	4.5500e-22
 1.7500e+1	3.8700e-22
 2.0500e+1	3.2400e-22
 2.4900e+1	2.5600e-22
 3.0900e+1	1.9600e-22
 4.1000e+1	1.3700e-22
 4.5000e+1	1.2000e-22
 1.0000e+4	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(b1)
  1.627e+0 / threshold energy
------------------------------------------------------------
 1.6270e+0	 0.0000e+0
 2.0000e+0	2.6000e-23
 3.0000e+0	9.7000e-23
 3.5000e+0	1.3300e-22
 4.0000e+0	1.4900e-22
 5.0000e+0	1.8200e-22
 5.6900e+0	1.9400e-22
 6.5400e+0	1.9400e-22
 7.3400e+0	1.9100e-22
 8.4100e+0	1.8300e-22
 9.2600e+0	1.7400e-22
 1.0000e+1	1.6000e-22
 1.3000e+1	1.3000e-22
 1.4900e+1	1.3000e-22
 1.7000e+1	1.3000e-22
 1.9400e+1	1.2500e-22
 2.0700e+1	1.2500e-22
 2.2500e+1	1.1000e-22
 2.4000e+1	1.0000e-22
 2.8000e+1	8.0000e-23
 3.5100e+1	6.3000e-23
 4.1900e+1	1.8000e-23
 4.5100e+1	5.0000e-24
 1.0000e+3	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(4.5eV)
  4.500e+0 / threshold energy
------------------------------------------------------------
 4.5000e+0	 0.0000e+0
 4.8000e+0	3.0000e-23
 5.0000e+0	9.0000e-23
 5.5000e+0	3.0000e-22
 6.0000e+0	6.5000e-22
 6.5000e+0	8.5000e-22
 7.0000e+0	9.5000e-22
 7.5000e+0	1.0000e-21
 8.0000e+0	1.0000e-21
 9.0000e+0	8.5000e-22
 1.0000e+1	7.0000e-22
 1.2000e+1	4.5000e-22
 1.5000e+1	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(6.0eV)
  6.000e+0 / threshold energy
------------------------------------------------------------
 6.0000e+0	 0.0000e+0
 7.0000e+0	1.5000e-21
 7.8000e+0	2.3000e-21
 9.0000e+0	2.3000e-21
 1.0000e+1	2.1000e-21
 1.2000e+1	1.6500e-21
 1.5000e+1	1.0500e-21
 1.7000e+1	6.5000e-22
 2.0000e+1	4.7500e-22
 4.5000e+1	1.9000e-22
 1.0000e+2	 0.0000e+0
------------------------------------------------------------

EXCITATION
O2 -> O2(8.4eV)
  8.400e+0 / threshold energy
------------------------------------------------------------
 8.4000e+0	 0.0000e+0
 9.4000e+0	1.0000e-20
 3.0000e+1	9.0000e-21
 5.0000e+1	7.0000e-21
 1.0000e+2	5.4000e-21
 1.5000e+2	3.2000e-21
 2.0000e+2	2.7000e-21
 3.0000e+2	1.7000e-21
 5.0000e+2	1.0900e-21
 7.0000e+2	8.0000e-22
 1.0000e+3	5.8000e-22
 1.5000e+3	4.2000e-22
 2.0000e+3	3.3000e-22
 3.0000e+3	2.4000e-22
 5.0000e+3	1.6000e-22
 7.0000e+3	1.2000e-22
 1.0000e+4	9.0000e-23
------------------------------------------------------------

EXCITATION
O2 -> O2(9.97eV)
  9.970e+0 / threshold energy
------------------------------------------------------------
 1.0000e+1	 0.0000e+0
 2.0000e+1	1.3000e-22
 3.0000e+1	2.6000e-22
 4.0000e+1	4.0000e-22
 5.0000e+1	5.0000e-22
 6.0000e+1	6.0000e-22
 7.0000e+1	6.5000e-22
 8.0000e+1	7.0000e-22
 1.0000e+2	7.0000e-22
 1.2000e+2	5.0000e-22
 1.5000e+2	4.0000e-22
 1.7000e+2	3.5000e-22
 2.0000e+2	3.0000e-22
 3.0000e+2	2.0000e-22
 5.0000e+2	1.2000e-22
 7.0000e+2	8.0000e-23
 1.0000e+3	5.0000e-23
 1.5000e+3	 0.0000e+0
------------------------------------------------------------

IONIZATION
O2 -> O2^+
  1.206e+1 / threshold energy
------------------------------------------------------------
 1.2060e+1	 0.0000e+0
 1.3000e+1	2.3000e-22
 1.8000e+1	2.0000e-21
 2.8000e+1	7.4000e-21
 3.8000e+1	1.3200e-20
 4.8000e+1	1.8000e-20
 5.8000e+1	2.1000e-20
 6.8000e+1	2.3300e-20
 7.8000e+1	2.5000e-20
 8.8000e+1	2.6000e-20
 1.0000e+2	2.7000e-20
 1.5000e+2	2.7000e-20
 2.0000e+2	2.5000e-20
 3.0000e+2	2.1700e-20
 5.0000e+2	1.6600e-20
 7.0000e+2	1.3500e-20
 1.0000e+3	1.0400e-20
 1.5000e+3	7.6000e-21
 2.0000e+3	6.0000e-21
 3.0000e+3	4.2000e-21
 5.0000e+3	2.7000e-21
 7.0000e+3	2.0000e-21
 1.0000e+4	1.4000e-21
------------------------------------------------------------

ATTACHMENT
O2 -> O^- + O
------------------------------------------------------------
 4.4000e+0	 0.0000e+0
 4.9000e+0	 0.0000e+0
 5.3800e+0	2.3000e-23
 5.8600e+0	7.2000e-23
 6.1000e+0	1.0800e-22
 6.4800e+0	1.3800e-22
 6.7700e+0	1.5200e-22
 7.0500e+0	1.5600e-22
 7.3000e+0	1.4800e-22
 7.5300e+0	1.3100e-22
 7.7700e+0	1.1000e-22
 8.0000e+0	8.4000e-23
 8.2500e+0	5.4000e-23
 8.7300e+0	2.8000e-23
 9.2000e+0	1.4000e-23
 9.6800e+0	8.0000e-24
 1.0150e+1	8.0000e-24
 1.1350e+1	8.0000e-24
 1.0000e+4	 0.0000e+0
------------------------------------------------------------
"""








HEADER = """# n2pulse electron-impact cross-section set: O2 (Phelps compilation)
# Format (n2pulse's own, version 1): see data/xsec-o2.txt. Made by scripts/xsec/o2_sets.py (run
# once; this file is its output). The O2 set of A.V. Phelps's compilation (S.A. Lawton &
# A.V. Phelps, J. Chem. Phys. 69, 1055 (1978)), derived together with swarm measurements in O2,
# as distributed in the community text format, every process with the source the copy read
# names. Elastic momentum transfer = the distributed effective momentum transfer minus the sum
# of the inelastic cross sections (see the script).
# Three-body attachment e + O2 + M -> O2- + M is not a cross section here: the solver adds it
# as a rate after the Boltzmann solve (see kinetics/swarm doc.go).
# Not included: superelastic collisions (negligible excited populations at 300 K).
format n2pulse-xsec 1
species O2
mass_amu 31.9988
"""


def main():
    outdir = sys.argv[1].rstrip("/")
    write_from_effective(outdir + "/xsec-o2-phelps.txt", HEADER, TRANSCRIPT, 16, SOURCES)


if __name__ == "__main__":
    main()

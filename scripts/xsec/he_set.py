#!/usr/bin/env python3
"""Write n2pulse's He cross-section set data/xsec-he.txt (used by every set).

Run once; its output is committed. The Go code never reads the community format.

Input: the He set of A.V. Phelps's compilation in the community text format, the He section
("From the compilation of A.V. Phelps.") of bolsigdb.dat in the public repository
seth303/ArrheniusRates (commit fd2d896; an LXCat export of 10 Nov 2011), its three data blocks
transcribed by hand into TRANSCRIPT below (comment and date lines left out, their content kept
in SOURCES). Elastic momentum transfer = the distributed effective (total) momentum transfer
minus the excitation and ionisation cross sections, on the union of all energies (exact for the
solver's piecewise-linear interpolation), as scripts/xsec/o2_sets.py does for O2.

usage: python3 scripts/xsec/he_set.py data/
"""
import sys

from xsec_common import write_from_effective

PHELPS = ("compilation of A.V. Phelps, read in the community-format copy in the public repository "
          "seth303/ArrheniusRates, bolsigdb.dat")
SOURCES = {
    "He": ("elastic", "He elastic momentum transfer", "",
           "effective (total) momentum transfer of the " + PHELPS + " (the file: 'from Crompton et al at "
           "low energy, Hayashi at high energies'), minus the excitation and ionisation cross sections "
           "(derived by scripts/xsec/he_set.py); mass ratio in the file 1.36e-4"),
    "He*(19.8eV)": ("excitation", "He -> He* (all excited states lumped, loss at the 2 3S threshold)", "",
                    "lumped excitation with a 19.8 eV loss; " + PHELPS + " (the file: 'from 1960's analysis of "
                    "Meier-Leibnitz and others by Phelps')"),
    "He^+": ("ionisation", "He -> He+", "ion",
             "D. Rapp & P. Englander-Golden, J. Chem. Phys. 43, 1464 (1965) (the file: 'Rapp and "
             "Englander-Golden, 1965'; journal reference from memory); as compiled in the " + PHELPS),
}

TRANSCRIPT = """
EFFECTIVE
He
  1.360e-4 / mass ratio
------------------------------------------------------------
 0.0000e+0	4.9600e-20
 1.0000e-3	4.9800e-20
 2.0000e-3	5.0200e-20
 3.0000e-3	5.0700e-20
 5.0000e-3	5.1200e-20
 7.0000e-3	5.1500e-20
 8.5000e-3	5.1800e-20
 1.0000e-2	5.2100e-20
 1.5000e-2	5.2800e-20
 2.0000e-2	5.3500e-20
 3.0000e-2	5.4600e-20
 4.0000e-2	5.5400e-20
 5.0000e-2	5.6200e-20
 7.0000e-2	5.7400e-20
 1.0000e-1	5.8600e-20
 1.2000e-1	5.9400e-20
 1.5000e-1	6.0400e-20
 1.7000e-1	6.0800e-20
 2.0000e-1	6.1600e-20
 2.5000e-1	6.2700e-20
 3.0000e-1	6.3500e-20
 3.5000e-1	6.4200e-20
 4.0000e-1	6.4900e-20
 5.0000e-1	6.5900e-20
 7.0000e-1	6.7300e-20
 1.0000e+0	6.8500e-20
 1.2000e+0	6.9100e-20
 1.3000e+0	6.9200e-20
 1.5000e+0	6.9600e-20
 1.7000e+0	6.9700e-20
 1.9000e+0	6.9800e-20
 2.1000e+0	6.9800e-20
 2.2000e+0	6.9800e-20
 2.5000e+0	6.9600e-20
 2.8000e+0	6.9200e-20
 3.0000e+0	6.8900e-20
 3.3000e+0	6.8200e-20
 3.6000e+0	6.7300e-20
 4.0000e+0	6.6000e-20
 4.5000e+0	6.4900e-20
 5.0000e+0	6.3100e-20
 6.0000e+0	6.0000e-20
 7.0000e+0	5.6800e-20
 8.0000e+0	5.3500e-20
 1.0000e+1	4.7200e-20
 1.2000e+1	4.2000e-20
 1.5000e+1	3.5000e-20
 1.7000e+1	3.1500e-20
 2.0000e+1	2.6400e-20
 2.5000e+1	2.0500e-20
 3.0000e+1	1.7400e-20
 5.0000e+1	1.1000e-20
 7.5000e+1	8.8000e-21
 1.0000e+2	7.5000e-21
 1.5000e+2	6.0500e-21
 2.0000e+2	5.2000e-21
 3.0000e+2	4.1000e-21
 5.0000e+2	3.0000e-21
 7.5000e+2	2.3500e-21
 1.0000e+3	1.7000e-21
------------------------------------------------------------

EXCITATION
He -> He*(19.8eV)
  1.980e+1 / threshold energy
------------------------------------------------------------
 1.9800e+1	 0.0000e+0
 2.0020e+1	4.1000e-22
 2.0240e+1	4.6000e-22
 2.1450e+1	4.2000e-22
 2.1800e+1	5.5000e-22
 2.2450e+1	5.5000e-22
 2.4220e+1	7.3000e-22
 2.5320e+1	9.2000e-22
 2.7530e+1	1.0800e-21
 2.9750e+1	1.1600e-21
 3.4180e+1	1.2100e-21
 4.6300e+1	1.2100e-21
 1.0000e+2	1.1500e-21
 2.0000e+2	1.0000e-21
 4.0000e+2	6.0000e-22
 7.0000e+2	3.5000e-22
 1.0000e+3	2.5000e-22
------------------------------------------------------------

IONIZATION
He -> He^+
  2.458e+1 / threshold energy
------------------------------------------------------------
 0.0000e+0	 0.0000e+0
 2.4600e+1	 0.0000e+0
 3.0000e+1	7.1000e-22
 3.4000e+1	1.2100e-21
 4.0000e+1	1.7800e-21
 4.5000e+1	2.1200e-21
 5.0000e+1	2.4200e-21
 6.0000e+1	2.8900e-21
 7.0000e+1	3.1300e-21
 8.0000e+1	3.3200e-21
 9.0000e+1	3.4400e-21
 1.0000e+2	3.5100e-21
 1.5000e+2	3.4600e-21
 2.0000e+2	3.2400e-21
 3.0000e+2	2.9000e-21
 5.0000e+2	2.2000e-21
 7.0000e+2	1.8000e-21
 1.0000e+3	1.4000e-21
------------------------------------------------------------
"""








HEADER = """# n2pulse electron-impact cross-section set: He (Phelps compilation; used by every set)
# Format (n2pulse's own, version 1): see data/xsec-o2.txt. Made by scripts/xsec/he_set.py (run
# once; this file is its output). The He set of A.V. Phelps's compilation as distributed in the
# community text format, every process with the source the copy read names. Elastic momentum
# transfer = the distributed effective momentum transfer minus the excitation and ionisation
# cross sections (see the script). The data end at 1 keV; beyond, the solver holds the last
# values.
# Not included: superelastic collisions (negligible excited populations at 300 K).
format n2pulse-xsec 1
species He
mass_amu 4.002602
"""


def main():
    outdir = sys.argv[1].rstrip("/")
    write_from_effective(outdir + "/xsec-he.txt", HEADER, TRANSCRIPT, 3, SOURCES)


if __name__ == "__main__":
    main()

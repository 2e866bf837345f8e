#!/usr/bin/env python3
"""Part-load motor and drive efficiency from the fluids package's transcriptions.

fluids.motor_efficiency_underloaded: polynomial fits to the WSEO (1993) typical motor
part-load curves (ratio to full-load efficiency); fluids.VFD_efficiency: the PWM drive
efficiency table (loads 1.6-100 %, 3-400 hp) that dutyline recalls from the DOE Motor
Systems Tip Sheet #11. Writes part_load_fluids.csv for tests/operation_profile.rs.
"""
import csv, os
import fluids

HP = 745.69987158227022
HERE = os.path.dirname(os.path.abspath(__file__))
RATINGS_HP = [0.75, 3, 7.5, 20, 50, 100, 150]
LOADS = [0.1, 0.15, 0.2, 0.25, 0.3, 0.35, 0.4, 0.5, 0.6, 0.75, 0.9, 1.0]
DRIVE_HP = [3, 5, 10, 20, 30, 50, 60, 75, 100, 200, 400]
DRIVE_LOADS = [0.016, 0.125, 0.25, 0.42, 0.5, 0.75, 1.0]

with open(os.path.join(HERE, "part_load_fluids.csv"), "w", newline="") as fh:
    fh.write(f"# gen_part_load.py: fluids {fluids.__version__}\n")
    w = csv.writer(fh)
    w.writerow(["kind", "rating_W", "load", "value"])
    for hp in RATINGS_HP:
        for x in LOADS:
            w.writerow(["motor_ratio", f"{hp * HP:.9g}", x, f"{min(fluids.motor_efficiency_underloaded(hp * HP, load=x), 1.0):.9g}"])
    for hp in DRIVE_HP:
        for x in DRIVE_LOADS:
            w.writerow(["drive_efficiency", f"{hp * HP:.9g}", x, f"{fluids.VFD_efficiency(hp * HP, load=x):.9g}"])

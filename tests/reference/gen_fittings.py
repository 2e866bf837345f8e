"""Reference loss coefficients from the Python `fluids` package (fluids.fittings).

Writes fittings_fluids.csv beside this script with columns
    fitting, check, re, d_m, nps, beta, angle_deg, k
where `fitting` is the dutyline name and `check` says what is compared:
  darby   K from fluids.fittings.Darby3K(NPS=nps, Re=re, name=<Darby entry>);
          dutyline evaluates at the ASME B36.10M schedule 40 ID of that NPS, where
          its Dn equals the NPS (exact formula, 1e-9 relative)
  hooper  K from fluids.fittings.Hooper2K(Di=d_m in inches, Re=re, name=<entry>)
          (exact formula, 1e-9 relative)
  limit   K at Re -> infinity (dutyline's Re = 0 value) from the named fluids
          function; tolerance per row in tests/fittings_reference.rs
  k1      laminar coefficient of a sharp entrance: Hooper (1988)'s 160/Re term
          recovered from fluids.fittings.contraction_sharp(method='Hooper')
  crane   Crane K = n fT from fluids.fittings.K_foot_valve_Crane (fluids fits fT to
          Crane's rounded table; dutyline uses Crane's printed formula: 2.5 %)
  size    expansions and contractions: fluids diffuser_sharp (Rennels form =
          Borda-Carnot), diffuser_conical / contraction_sharp /
          contraction_conical (method='Crane'), on the small-pipe velocity
          (exact formulas, 1e-12 relative)

Run: pip install fluids && python tests/reference/gen_fittings.py
"""
import csv
import os

import fluids
import fluids.fittings as ff

INCH = 0.0254

# dutyline name -> Darby dictionary key (fluids.fittings.Darby)
DARBY = {
    "elbow_90_standard": "Elbow, 90°, flanged, welded, bends, (r/D = 1)",
    "elbow_90_long": "Elbow, 90°, threaded, long radius, (r/D = 1.5)",
    "elbow_90_threaded": "Elbow, 90°, threaded, standard, (r/D = 1)",
    "bend_90_r2d": "Elbow, 90°, (r/D = 2)",
    "bend_90_r4d": "Elbow, 90°, (r/D = 4)",
    "bend_90_r6d": "Elbow, 90°, (r/D = 6)",
    "elbow_90_mitre_1_weld": "Elbow, 90°, mitered, 1 weld, (90°)",
    "elbow_90_mitre_2_welds": "Elbow, 90°, 2 welds, (45°)",
    "elbow_90_mitre_3_welds": "Elbow, 90°, 3 welds, (30°)",
    "elbow_45_standard": "Elbow, 45°, threaded standard, (r/D = 1)",
    "elbow_45_long": "Elbow, 45°, long radius, (r/D = 1.5)",
    "elbow_45_mitre_1_weld": "Elbow, 45°, mitered, 1 weld, (45°)",
    "elbow_45_mitre_2_welds": "Elbow, 45°, mitered, 2 welds, (22.5°)",
    "return_bend": "Elbow, 180°, flanged, (r/D = 1)",
    "return_bend_threaded": "Elbow, 180°, threaded, close-return bend, (r/D = 1)",
    "return_bend_long": "Elbow, 180°, all, (r/D = 1.5)",
    "tee_run": "Tee, Run-through, flanged, (r/D = 1)",
    "tee_run_threaded": "Tee, Run-through, threaded, (r/D = 1)",
    "tee_branch": "Tee, Through-branch, (as elbow), flanged, (r/D = 1)",
    "tee_branch_threaded": "Tee, Through-branch, (as elbow), threaded, (r/D = 1)",
    "tee_branch_long": "Tee, Through-branch,(as elbow), (r/D = 1.5)",
    "tee_branch_stub_in": "Tee, Through-branch, (as elbow), stub-in branch",
    "gate_valve": ff.DARBY_GATE_VALVE,
    "globe_valve": ff.DARBY_GLOBE_FULL_VALVE,
    "ball_valve": ff.DARBY_BALL_VALVE,
    "plug_valve": ff.DARBY_PLUG_VALVE_STRAIGHT_THROUGH,
    "plug_valve_branch": ff.DARBY_PLUG_VALVE_BRANCH_FLOW,
    "plug_valve_three_way": ff.DARBY_PLUG_VALVE_THREE_WAY_FLOW_THROUGH,
    "diaphragm_valve": ff.DARBY_DIAPHRAGM_DAM_VALVE,
    "angle_valve_45": ff.DARBY_ANGLE_45DEG_FULL_VALVE,
    "angle_valve_90": ff.DARBY_ANGLE_90DEG_FULL_VALVE,
    "check_valve_swing": ff.DARBY_SWING_CHECK_VALVE,
    "check_valve_lift": ff.DARBY_LIFT_CHECK_VALVE,
}

# dutyline name -> Hooper dictionary key (fluids.fittings.Hooper)
HOOPER = {
    "butterfly_valve": ff.HOOPER_BUTTERFLY_VALVE,
    "check_valve_tilting_disc": ff.HOOPER_CHECK_VALVE_TILTING_DISK,
    "ball_valve_reduced_bore": ff.HOOPER_BALL_REDUCED_TRIM_VALVE,
    "plug_valve_reduced_bore": ff.HOOPER_PLUG_REDUCED_TRIM_VALVE,
}

REYNOLDS = [1.0, 100.0, 2.0e3, 1.0e5, 1.0e7]
NPS = [0.5, 1.0, 2.0, 4.0, 6.0, 12.0, 24.0]
DIAMETERS_M = [0.01, 0.05, 0.154, 0.5, 2.0]
BETAS = [0.2, 0.5, 0.8]
ANGLES_DEG = [10.0, 30.0, 60.0, 120.0, 180.0]


def main():
    rows = []

    def text(x):
        return "" if x == "" else repr(float(x))

    def add(fitting, check, re, d_m, nps, beta, angle, k):
        rows.append([fitting, check, text(re), text(d_m), text(nps), text(beta),
                     text(angle), text(k)])

    for name, key in DARBY.items():
        for nps in NPS:
            for re in REYNOLDS:
                add(name, "darby", re, "", nps, "", "", ff.Darby3K(NPS=nps, Re=re, name=key))
    for name, key in HOOPER.items():
        for d in DIAMETERS_M:
            for re in REYNOLDS:
                add(name, "hooper", re, d, "", "", "", ff.Hooper2K(Di=d / INCH, Re=re, name=key))

    d = 0.1
    add("entrance_flush", "limit", 0.0, d, "", "", "", ff.entrance_sharp(method="Crane"))
    add("entrance_rounded", "limit", 0.0, d, "", "", "",
        ff.entrance_rounded(Di=d, rc=0.15 * d, method="Crane"))
    add("entrance_projecting", "limit", 0.0, d, "", "", "",
        ff.entrance_distance(Di=d, t=1e-4 * d, method="Idelchik"))
    add("exit", "limit", 0.0, d, "", "", "", ff.exit_normal())
    for re in [10.0, 100.0, 1000.0]:
        big = 1.0e3 * d
        k_lam = ff.contraction_sharp(Di1=big, Di2=d, Re=re, method="Hooper")
        beta4 = (d / big) ** 4
        k1 = (k_lam / (1.0 - beta4) - 1.2) * re
        add("entrance_flush", "k1", re, d, "", "", "", k1)

    for d in DIAMETERS_M:
        add("foot_valve", "crane", 1.0e6, d, "", "", "", ff.K_foot_valve_Crane(D=d, style=1))
        add("foot_valve_poppet", "crane", 1.0e6, d, "", "", "", ff.K_foot_valve_Crane(D=d, style=0))

    d = 0.1
    for beta in BETAS:
        big = d / beta
        add("expansion_sudden", "size", 1.0e5, d, "", beta, "",
            ff.diffuser_sharp(Di1=d, Di2=big, method="Rennels"))
        add("contraction_sudden", "size", 1.0e5, d, "", beta, "",
            ff.contraction_sharp(Di1=big, Di2=d, method="Crane"))
        for angle in ANGLES_DEG:
            add("expansion_gradual", "size", 1.0e5, d, "", beta, angle,
                ff.diffuser_conical(Di1=d, Di2=big, angle=angle, method="Crane"))
            add("contraction_gradual", "size", 1.0e5, d, "", beta, angle,
                ff.contraction_conical(Di1=big, Di2=d, angle=angle, method="Crane"))

    out = os.path.join(os.path.dirname(os.path.abspath(__file__)), "fittings_fluids.csv")
    with open(out, "w", newline="") as fh:
        fh.write(f"# generated by gen_fittings.py with fluids {fluids.__version__}\n")
        writer = csv.writer(fh, lineterminator="\n")
        writer.writerow(["fitting", "check", "re", "d_m", "nps", "beta", "angle_deg", "k"])
        writer.writerows(rows)
    print(f"wrote {len(rows)} rows to {out}")


if __name__ == "__main__":
    main()

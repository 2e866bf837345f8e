"""Reading the results JSON of format 2 (`dutyline-results/2`, docs/results-json.md,
"Format 2") in the shape of format 1, for the reference scripts written against it.

Format 2 moves what repeats in every case to tables at the top (segments, line
profiles, source texts) and writes lists of points as columns; `expand_v2` puts them
back: every index is replaced by what it refers to and every column object becomes a
list of rows. No value is computed: the numbers are those of the document.
"""


def _rows(columns, names=None):
    """An object of equal-length arrays as a list of objects."""
    keys = [k for k in columns if names is None or k in names]
    n = max((len(columns[k]) for k in keys), default=0)
    return [{k: columns[k][i] for k in keys} for i in range(n)]


def expand_v2(doc):
    """The format-2 document `doc` (a dict, changed in place) in the format-1 shape."""
    if doc.get("format") != "dutyline-results/2":
        return doc
    sources = doc.get("sources", [])
    segments = doc.get("segments", [])
    profiles = doc.get("line_profiles", [])

    def source(i):
        return sources[i] if isinstance(i, int) else i

    def checks(items):
        for c in items:
            c["source"] = source(c["source"])

    for case in doc["cases"]:
        if case.get("fluid"):
            case["fluid"]["source"] = source(case["fluid"]["source"])
        ks = case.pop("fittings_k", [])
        segs = []
        for j, i in enumerate(case["segments"]):
            seg = dict(segments[i])
            seg["fittings"] = [dict(f) for f in seg["fittings"]]
            for f, k in zip(seg["fittings"], ks[j] if j < len(ks) else []):
                f["k"] = k
            segs.append(seg)
        case["segments"] = segs
        case["system_curve"] = _rows(case["system_curve"])
        for p in case["pumps"]:
            p["motor_efficiency_source"] = source(p["motor_efficiency_source"])
            checks(p["checks"])
            d = p.get("duty")
            if d:
                rows = _rows(d["segments"])
                for j, r in enumerate(rows):
                    s = segs[j]
                    d_row = {"line": s["line"], "side": s["side"], "index": s["index"]}
                    d_row.update(r)
                    rows[j] = d_row
                d["segments"] = rows
                env = d.get("envelope")
                if env:
                    for w in env.get("checks", []):
                        for key in ("nominal", "worst"):
                            if isinstance(w.get(key), dict):
                                w[key]["source"] = source(w[key]["source"])
        lines = []
        for line in case.get("lines", []):
            prof = profiles[line["profile"]]
            out = {"name": prof["name"], "side": prof["side"],
                   "profile_source": prof["profile_source"], "length_m": prof["length_m"],
                   "duty_flow_m3_s": line["duty_flow_m3_s"],
                   "vapour_pressure_gauge_Pa": line["vapour_pressure_gauge_Pa"]}
            cols = {k: prof[k] for k in ("chainage_m", "elevation_m", "segment")}
            for k in ("grade_duty_m", "pressure_duty_Pa", "pressure_static_Pa",
                      "pressure_shutoff_Pa", "pressure_downsurge_Pa"):
                cols[k] = line[k]
            cols["rating_Pa"] = prof["rating_Pa"]
            cols["transient_rating_Pa"] = prof["transient_rating_Pa"]
            out["profile"] = _rows(cols)
            out["minimum_duty"] = line["minimum_duty"]
            out["high_points"] = prof["high_points"]
            out["ratings"] = prof["ratings"]
            surge = line.get("surge")
            if surge is not None:
                walls = prof.get("wave_segments") or []
                a = surge.pop("segment_wave_speed_m_s", [])
                b = surge.pop("segment_lowest_wave_speed_m_s", [])
                segs_w = []
                for j, w in enumerate(walls):
                    if w is None or a[j] is None:
                        segs_w.append(None)
                    else:
                        row = {"wave_speed_m_s": a[j], "lowest_wave_speed_m_s": b[j]}
                        row.update(w)
                        segs_w.append(row)
                surge["segments"] = segs_w
            out["surge"] = surge
            checks(line["checks"])
            out["checks"] = line["checks"]
            lines.append(out)
        case["lines"] = lines
    for cand in doc.get("candidates", []):
        for c in cand.get("profile_checks", []) or []:
            c["source"] = source(c["source"])
    doc["format"] = "dutyline-results/1 (expanded from dutyline-results/2)"
    return doc

package hammerstep.analysis;

import java.util.List;
import java.util.Locale;
import java.util.Map;
import java.util.TreeMap;

/**
 * The tally of a what-if: stored verdicts set beside the verdicts a changed program gives the same
 * traces. A joint <em>changes</em> when its verdict does (GO→NO_GO or NO_GO→GO); a joint whose
 * verdict stays but whose reasons differ is counted apart. Per reason, how many joints gain it and
 * how many lose it; per program and per program and position, how many joints and how many
 * change each way. Not thread-safe; one per run.
 */
public final class WhatIf {

    /** The verdict a joint is given when its trace holds no rundown under the new program. */
    public static final String NO_RUNDOWN = "NO_RUNDOWN";

    /** Counts for one program, or one position of a program. */
    public static final class Counts {
        int joints;
        int goToNoGo;
        int noGoToGo;
        int otherReasons;

        public int joints() {
            return joints;
        }

        public int goToNoGo() {
            return goToNoGo;
        }

        public int noGoToGo() {
            return noGoToGo;
        }

        public int otherReasons() {
            return otherReasons;
        }
    }

    private final Counts all = new Counts();
    private final Map<String, Counts> byProgram = new TreeMap<>();
    private final Map<String, Counts> byPosition = new TreeMap<>();
    private final Map<String, int[]> byReason = new TreeMap<>();

    /** How a joint's verdict moves; {@code "same"} when it does not. */
    public static String change(String storedVerdict, String newVerdict) {
        boolean wasGo = "GO".equals(storedVerdict);
        boolean isGo = "GO".equals(newVerdict);
        if (wasGo == isGo) {
            return "same";
        }
        return wasGo ? "GO->NO_GO" : "NO_GO->GO";
    }

    /**
     * Adds one joint; returns its change ({@link #change}). {@code storedReasons} is null when only
     * the stored verdict is known (a trace's header without its result): reasons are then not compared.
     */
    public String add(String program, String position, String storedVerdict, List<String> storedReasons,
                      String newVerdict, List<String> newReasons) {
        String change = change(storedVerdict, newVerdict);
        boolean sameReasons = storedReasons == null
                || storedReasons.size() == newReasons.size() && storedReasons.containsAll(newReasons);
        Counts p = byProgram.computeIfAbsent(program, k -> new Counts());
        Counts q = byPosition.computeIfAbsent(program + " " + position, k -> new Counts());
        for (Counts c : new Counts[] {all, p, q}) {
            c.joints++;
            if (change.equals("GO->NO_GO")) {
                c.goToNoGo++;
            } else if (change.equals("NO_GO->GO")) {
                c.noGoToGo++;
            } else if (!sameReasons) {
                c.otherReasons++;
            }
        }
        if (storedReasons == null) {
            return change;
        }
        for (String r : newReasons) {
            if (!storedReasons.contains(r)) {
                byReason.computeIfAbsent(r, k -> new int[2])[0]++;
            }
        }
        for (String r : storedReasons) {
            if (!newReasons.contains(r)) {
                byReason.computeIfAbsent(r, k -> new int[2])[1]++;
            }
        }
        return change;
    }

    public Counts all() {
        return all;
    }

    public Map<String, Counts> byProgram() {
        return byProgram;
    }

    /** Keyed by program and position label, separated by a space. */
    public Map<String, Counts> byPosition() {
        return byPosition;
    }

    /** Per reason: {joints that gain it, joints that lose it}. */
    public Map<String, int[]> byReason() {
        return byReason;
    }

    /** The summary as a few lines of text. */
    public String summary() {
        StringBuilder sb = new StringBuilder();
        int changed = all.goToNoGo + all.noGoToGo;
        sb.append(String.format(Locale.ROOT, "%d joints compared: %d would change verdict (%d GO->NO_GO, %d NO_GO->GO),"
                + " %d keep their verdict with other reasons%n", all.joints, changed, all.goToNoGo, all.noGoToGo,
                all.otherReasons));
        if (!byReason.isEmpty()) {
            sb.append(String.format(Locale.ROOT, "%-24s %8s %8s%n", "by reason", "gained", "lost"));
            byReason.forEach((r, n) -> sb.append(String.format(Locale.ROOT, "  %-22s %8d %8d%n", r, n[0], n[1])));
        }
        table(sb, "by program", byProgram);
        table(sb, "by program and position", byPosition);
        return sb.toString();
    }

    private static void table(StringBuilder sb, String title, Map<String, Counts> rows) {
        if (rows.isEmpty()) {
            return;
        }
        int width = title.length();
        for (String k : rows.keySet()) {
            width = Math.max(width, k.length() + 2);
        }
        sb.append(String.format(Locale.ROOT, "%-" + width + "s %8s %10s %10s %14s%n", title, "joints", "GO->NO_GO",
                "NO_GO->GO", "other reasons"));
        String row = "  %-" + (width - 2) + "s %8d %10d %10d %14d%n";
        for (Map.Entry<String, Counts> e : rows.entrySet()) {
            Counts c = e.getValue();
            sb.append(String.format(Locale.ROOT, row, e.getKey(), c.joints, c.goToNoGo, c.noGoToGo, c.otherReasons));
        }
    }
}

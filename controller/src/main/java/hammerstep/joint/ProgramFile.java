package hammerstep.joint;

import hammerstep.config.ConfigException;
import hammerstep.config.MapReader;
import hammerstep.config.Problems;
import hammerstep.config.YamlDocument;

import java.nio.file.Path;

/**
 * Reads and validates a joint program file (keys in docs/engineer-guide.md). Every problem is
 * reported as {@code file:line:column: message} naming the key and what was expected.
 */
public final class ProgramFile {

    private static final double MAX_NM = 100_000.0;

    private ProgramFile() {
    }

    public static JointProgram load(Path path) throws ConfigException {
        return read(YamlDocument.read(path));
    }

    public static JointProgram read(YamlDocument doc) throws ConfigException {
        Problems problems = new Problems(doc.file());
        MapReader root = MapReader.of(problems, doc.root());
        JointProgram program = read(root, doc.revision());
        root.finish();
        problems.throwIfAny();
        return program;
    }

    /**
     * Reads a program from a map (a file's root, or a program written inline in a pattern).
     * Problems go to the reader's collector; the caller calls {@code finish()} on the reader.
     */
    public static JointProgram read(MapReader root, String revision) {
        String id = root.string("id");
        if (!id.isEmpty() && !id.matches("[A-Za-z0-9][A-Za-z0-9._-]{0,63}")) {
            root.problem("id", "'" + root.path("id") + "' is \"" + id
                    + "\": expected letters, digits, '.', '_' or '-', at most 64");
        }

        MapReader t = root.map("torque");
        double min = t.requiredNumber("min", 0, MAX_NM);
        double target = t.requiredNumber("target", 0, MAX_NM);
        double max = t.requiredNumber("max", 0, MAX_NM);
        if (min > max) {
            t.problem("min", "'" + t.path("min") + "' (" + min + ") is above '" + t.path("max") + "' (" + max + ")");
        } else if (!Double.isNaN(min + max) && (target < min || target > max)) {
            t.problem("target", "'" + t.path("target") + "' (" + target + ") must lie between min (" + min
                    + ") and max (" + max + ")");
        }
        t.finish();

        FinalTorque finalTorque = FinalTorque.ofKey(root.choice("final_torque", "max_peak", FinalTorque.keys()));
        boolean onResidual = finalTorque == FinalTorque.RESIDUAL_ESTIMATE;

        MapReader b = root.map("blows");
        double countAbove = b.requiredNumber("count_above", 0, MAX_NM);
        double releaseBelow = b.number("release_below", Double.isNaN(countAbove) ? 0 : 0.5 * countAbove, 0, MAX_NM);
        int blowsMin = b.integer("min", 0, 100_000);
        int blowsMax = b.integer("max", 0, 100_000);
        double maxRate = b.number("max_rate_per_min", JointProgram.DEFAULT_MAX_RATE_PER_MIN, 60, 60_000);
        double deadTime = b.number("dead_time_ms", JointProgram.deadTimeMsFor(maxRate), 0, 1000);
        if (b.has("dead_time_ms") && b.has("max_rate_per_min")) {
            b.problem("dead_time_ms", "'" + b.path("dead_time_ms") + "' and '" + b.path("max_rate_per_min")
                    + "' both set the dead time: give one of them");
        }
        if (blowsMin > blowsMax) {
            b.problem("min", "'" + b.path("min") + "' (" + blowsMin + ") is above '" + b.path("max") + "' (" + blowsMax + ")");
        }
        if (b.has("release_below") && releaseBelow >= countAbove) {
            b.problem("release_below", "'" + b.path("release_below") + "' (" + releaseBelow
                    + ") must be below count_above (" + countAbove + "): a blow ends when torque falls below it");
        }
        if (countAbove > max) {
            b.problem("count_above", "'" + b.path("count_above") + "' (" + countAbove + ") is above torque.max ("
                    + max + "): every counted blow would be beyond the window, no joint could be GO");
        }
        if (blowsMin == 0 && b.has("max") && "0".equals(b.child("max").text())) {
            b.problem("max", "'" + b.path("max") + "' is 0: a joint without blows has no torque, no joint could be GO");
        }
        // the fastest a tool can strike blows.min blows: no rundown shorter than that can be GO
        double intervalMs = b.has("dead_time_ms") ? deadTime : 60_000.0 / maxRate;
        double leastMs = Math.max(0, blowsMin - 1) * intervalMs;
        b.finish();

        MapReader r = root.map("rundown");
        double startAbove = r.requiredNumber("start_above", 0, MAX_NM);
        double endAfter = r.requiredNumber("end_after_ms", 1, 60_000);
        double maxMs = r.requiredNumber("max_ms", 1, 600_000);
        if (startAbove > countAbove) {
            r.problem("start_above", "'" + r.path("start_above") + "' (" + startAbove
                    + ") must not be above blows.count_above (" + countAbove + "): a blow would start no rundown");
        }
        if (endAfter >= maxMs) {
            r.problem("end_after_ms", "'" + r.path("end_after_ms") + "' (" + endAfter + ") must be below max_ms (" + maxMs + ")");
        } else if (maxMs < leastMs) {
            r.problem("max_ms", "'" + r.path("max_ms") + "' (" + maxMs + ") is shorter than blows.min (" + blowsMin
                    + ") blows take at the tool's fastest rate (" + Math.round(leastMs) + " ms): every rundown with"
                    + " enough blows would be cut as TIME_LONG");
        }
        r.finish();

        double shutoff = root.number("shutoff_at", Double.NaN, 0, MAX_NM);
        if (!Double.isNaN(shutoff) && shutoff < countAbove) {
            root.problem("shutoff_at", "'shutoff_at' (" + shutoff + ") is below blows.count_above (" + countAbove + ")");
        } else if (shutoff < min) {
            root.problem("shutoff_at", "'shutoff_at' (" + shutoff + ") is below torque.min (" + min
                    + "): the tool would stop before a joint reaches its window");
        } else if (shutoff > max && !onResidual) {
            // judged on the residual estimate, the window is a residual one: blow peaks run above it
            root.problem("shutoff_at", "'shutoff_at' (" + shutoff + ") is above torque.max (" + max
                    + "): the tool would only stop after the joint is over torque");
        }
        int rehit = root.integer("rehit_blows", 0, 0, 1000);
        if (rehit > 0 && blowsMax > 0 && rehit >= blowsMax) {
            root.problem("rehit_blows", "'rehit_blows' (" + rehit + ") is not below blows.max (" + blowsMax
                    + "): every joint within the blow window would be REHIT, no joint could be GO");
        } else if (rehit > 0 && onResidual) {
            root.problem("rehit_blows", "'rehit_blows' judges blow peaks against torque.min, which under"
                    + " 'final_torque: residual_estimate' is a residual window the peaks run above: every joint would"
                    + " be REHIT; leave rehit_blows out (a rehit turns the nut no further: no turning blow,"
                    + " RESIDUAL_UNKNOWN)");
        }
        boolean leftHand = "left".equals(root.choice("thread", "right", java.util.List.of("right", "left")));
        ResidualCalibration calibration = calibration(root.optionalMap("residual_calibration"));

        return new JointProgram(id, revision, new JointProgram.Torque(min, target, max), finalTorque,
                new JointProgram.Blows(countAbove, releaseBelow, blowsMin, blowsMax, deadTime),
                new JointProgram.Rundown(startAbove, endAfter, maxMs), shutoff, rehit, leftHand, calibration);
    }

    /**
     * {@code residual_calibration: { factor, offset_nm, band_nm, audits, date }} as {@code hammerstep audit}
     * prints it; null when absent or wrong (the problems are reported).
     */
    private static ResidualCalibration calibration(MapReader c) {
        if (c == null) {
            return null;
        }
        double factor = c.requiredNumber("factor", ResidualCalibration.MIN_FACTOR, ResidualCalibration.MAX_FACTOR);
        double offset = c.requiredNumber("offset_nm", -MAX_NM, MAX_NM);
        double band = c.requiredNumber("band_nm", 0, MAX_NM);
        int audits = c.integer("audits", ResidualCalibration.MIN_AUDITS, 1_000_000);
        String text = c.string("date");
        java.time.LocalDate date = null;
        try {
            date = text.isEmpty() ? null : java.time.LocalDate.parse(text);
        } catch (java.time.format.DateTimeParseException e) {
            c.problem("date", "'" + c.path("date") + "' is \"" + text + "\": expected the day of the fit as YYYY-MM-DD");
        }
        if (band == 0) {
            c.problem("band_nm", "'" + c.path("band_nm") + "' is 0: audits always scatter; give the band the fit left");
        }
        c.finish();
        if (Double.isNaN(factor + offset + band) || date == null || band == 0) {
            return null;
        }
        return new ResidualCalibration(factor, offset, band, audits, date);
    }
}

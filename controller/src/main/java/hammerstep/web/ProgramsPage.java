package hammerstep.web;

import hammerstep.joint.JointProgram;
import hammerstep.sequence.Pattern;

import java.util.ArrayList;
import java.util.LinkedHashMap;
import java.util.List;
import java.util.Map;

/**
 * The programs and patterns the station judges with, as it read them at its start: each pattern
 * with the part models that use it, its revision and its passes; each program with its revision
 * (the {@code program_revision} every joint result and stored trace carries: the first 12 hex
 * digits of the SHA-256 of the program file), its windows and where it is used; and the lines
 * {@code hammerstep check} gives for the station's files as they are on disk now (a file edited
 * since the start shows its problems here before the next start refuses it).
 *
 * <p>Element ids, kept stable for the browser tests: {@code programs-patterns} (table, one row per
 * pattern and pass, {@code data-pattern} on each row), {@code programs-programs} (table, one row per
 * program and revision, {@code data-program} on each row, the revision in a cell of class
 * {@code revision}), {@code programs-validation} (list of check's lines, one {@code li} each) or
 * {@code programs-valid} (when check finds nothing).
 */
final class ProgramsPage {

    private ProgramsPage() {
    }

    static Pages.Reply of(Pages pages, WebStation station) {
        StringBuilder b = new StringBuilder(pages.head("Programs and patterns"));
        if (station.patterns().isEmpty()) {
            b.append("<p>The view was started without the station's patterns: nothing to show.</p>");
            return new Pages.Reply(200, b.append(Pages.foot()).toString());
        }
        b.append("<p class=\"note\">As the station read them at its start. A revision is the first 12 hex digits of")
                .append(" the SHA-256 of the file: the <code>program_revision</code> of every joint result and stored")
                .append(" trace.</p>");
        Map<String, List<String>> modelsByPattern = new LinkedHashMap<>();
        Map<String, Pattern> patterns = new LinkedHashMap<>();
        station.patterns().forEach((model, p) -> {
            String key = p.id() + " " + p.revision();
            patterns.putIfAbsent(key, p);
            modelsByPattern.computeIfAbsent(key, k -> new ArrayList<>()).add(model);
        });
        b.append("<h2>Patterns</h2><table id=\"programs-patterns\"><thead><tr><th>pattern</th><th>revision</th>")
                .append("<th>part models</th><th>positions</th><th>pass</th><th>program</th><th>order</th>")
                .append("<th>attempts</th></tr></thead><tbody>");
        Map<String, JointProgram> programs = new LinkedHashMap<>();
        Map<String, List<String>> usedBy = new LinkedHashMap<>();
        patterns.forEach((key, p) -> {
            for (Pattern.Pass pass : p.passes()) {
                JointProgram prog = pass.program();
                String pk = prog.id() + " " + prog.revision();
                programs.putIfAbsent(pk, prog);
                usedBy.computeIfAbsent(pk, k -> new ArrayList<>()).add(p.id() + " · " + pass.name());
                StringBuilder order = new StringBuilder();
                for (int i : pass.order()) {
                    order.append(order.length() == 0 ? "" : " ").append(p.positions().get(i));
                }
                b.append("<tr data-pattern=\"").append(Html.esc(p.id())).append("\"><td>").append(Html.esc(p.id()))
                        .append("</td><td class=\"revision\"><code>").append(Html.esc(p.revision()))
                        .append("</code></td><td>").append(Html.esc(String.join(" ", modelsByPattern.get(key))))
                        .append("</td><td class=\"num\">").append(p.size()).append("</td><td>")
                        .append(Html.esc(pass.name())).append("</td><td>").append(Html.esc(prog.id()))
                        .append("</td><td>").append(Html.esc(order.toString())).append("</td><td class=\"num\">")
                        .append(pass.attempts()).append("</td></tr>");
            }
        });
        b.append("</tbody></table>");
        b.append("<h2>Programs</h2><table id=\"programs-programs\"><thead><tr><th>program</th><th>revision</th>")
                .append("<th>torque min · target · max, N·m</th><th>final torque</th><th>blows min · max</th>")
                .append("<th>counted above, N·m</th><th>shut-off, N·m</th><th>thread</th><th>used in</th></tr></thead><tbody>");
        programs.forEach((key, p) -> b.append("<tr data-program=\"").append(Html.esc(p.id())).append("\"><td>")
                .append(Html.esc(p.id())).append("</td><td class=\"revision\"><code>").append(Html.esc(p.revision()))
                .append("</code></td><td class=\"num\">").append(Html.num(p.torque().minNm(), 1)).append(" · ")
                .append(Html.num(p.torque().targetNm(), 1)).append(" · ").append(Html.num(p.torque().maxNm(), 1))
                .append("</td><td>").append(p.finalTorque().key()).append("</td><td class=\"num\">")
                .append(p.blows().min()).append(" · ").append(p.blows().max()).append("</td><td class=\"num\">")
                .append(Html.num(p.blows().countAboveNm(), 1)).append("</td><td class=\"num\">")
                .append(p.hasShutoff() ? Html.num(p.shutoffAtNm(), 1) : "none").append("</td><td>")
                .append(p.leftHand() ? "left-hand" : "right-hand").append("</td><td>")
                .append(Html.esc(String.join(", ", usedBy.get(key)))).append("</td></tr>"));
        b.append("</tbody></table>");
        b.append("<h2>Validation</h2>");
        List<String> lines;
        try {
            lines = station.validation().get();
        } catch (RuntimeException e) {
            lines = List.of("the station's files could not be checked: " + e.getMessage());
        }
        if (lines.isEmpty()) {
            b.append("<p id=\"programs-valid\">").append("<code>hammerstep check</code> finds no problem in the station's")
                    .append(" files as they are on disk now.</p>");
        } else {
            b.append("<p class=\"error\"><code>hammerstep check</code> on the station's files as they are on disk now")
                    .append(" (the station runs with what it read at its start; the next start would refuse these):")
                    .append("</p><ul class=\"problems\" id=\"programs-validation\">");
            for (String line : lines) {
                b.append("<li><code>").append(Html.esc(line)).append("</code></li>");
            }
            b.append("</ul>");
        }
        return new Pages.Reply(200, b.append(Pages.foot()).toString());
    }

}

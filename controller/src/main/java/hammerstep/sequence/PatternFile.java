package hammerstep.sequence;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.MapReader;
import hammerstep.config.Problem;
import hammerstep.config.Problems;
import hammerstep.config.YamlDocument;
import hammerstep.joint.JointProgram;
import hammerstep.joint.ProgramFile;

import java.nio.file.Path;
import java.util.ArrayList;
import java.util.HashSet;
import java.util.List;
import java.util.Set;

/**
 * Reads and validates a pattern file (keys in docs/patterns.md). Program files named by a pass are
 * read relative to the pattern file; their problems are reported in their own files. Every problem is
 * {@code file:line:column: message}.
 */
public final class PatternFile {

    /** Most positions a pattern may have. */
    public static final int MAX_POSITIONS = 128;

    private static final List<String> ORDERS = List.of("cross", "circular");
    private static final List<String> ACKS = List.of(Acknowledge.OPERATOR.key(), Acknowledge.SUPERVISOR.key());
    private static final List<String> AFTER = List.of(AfterNoGo.REJECT.key(), AfterNoGo.SKIP_POSITION.key(),
            AfterNoGo.CONTINUE.key());

    private PatternFile() {
    }

    public static Pattern load(Path path) throws ConfigException {
        YamlDocument doc = YamlDocument.read(path);
        Path dir = path.toAbsolutePath().getParent();
        return read(doc, dir);
    }

    /** Reads a parsed pattern; relative program paths resolve against {@code dir}. */
    public static Pattern read(YamlDocument doc, Path dir) throws ConfigException {
        Problems problems = new Problems(doc.file());
        List<Problem> elsewhere = new ArrayList<>();
        MapReader root = MapReader.of(problems, doc.root());
        String id = root.string("id");
        if (!id.isEmpty() && !id.matches("[A-Za-z0-9][A-Za-z0-9._-]{0,63}")) {
            root.problem("id", "'id' is \"" + id + "\": expected letters, digits, '.', '_' or '-', at most 64");
        }
        List<String> positions = positions(root);
        List<Pattern.Pass> passes = new ArrayList<>();
        List<ConfigNode> passNodes = root.list("passes", true);
        if (passNodes.isEmpty() && root.has("passes")) {
            root.problem("passes", "'passes' is empty: expected at least one pass");
        }
        Set<String> names = new HashSet<>();
        for (ConfigNode node : passNodes) {
            Pattern.Pass pass = pass(MapReader.of(problems, node), positions.size(), dir, elsewhere, names);
            if (pass != null) {
                passes.add(pass);
            }
        }
        root.finish();
        List<Problem> all = new ArrayList<>(problems.list());
        all.addAll(elsewhere);
        if (!all.isEmpty()) {
            throw new ConfigException(all);
        }
        return new Pattern(id, doc.revision(), positions, passes);
    }

    private static List<String> positions(MapReader root) {
        ConfigNode node = root.child("positions");
        List<String> labels = new ArrayList<>();
        if (node == null || node.kind() == ConfigNode.Kind.NULL) {
            root.problem("positions", "missing key 'positions': expected a list of position labels or a count");
            return labels;
        }
        if (node.kind() == ConfigNode.Kind.NUMBER) {
            int n = countOf(root, node);
            for (int k = 1; k <= n; k++) {
                labels.add(Integer.toString(k));
            }
            return labels;
        }
        if (node.kind() != ConfigNode.Kind.LIST) {
            root.problem("positions", "'positions': expected a list of position labels or a count, got "
                    + node.describe());
            return labels;
        }
        Set<String> seen = new HashSet<>();
        for (ConfigNode item : node.items()) {
            if (!item.isScalar() || item.text().isBlank()) {
                root.problems().add(item, "'" + item.path() + "': expected a position label, got " + item.describe());
                continue;
            }
            if (!seen.add(item.text())) {
                root.problems().add(item, "'" + item.path() + "': position label \"" + item.text()
                        + "\" is used twice");
            }
            labels.add(item.text());
        }
        if (labels.isEmpty() && node.items().isEmpty()) {
            root.problem("positions", "'positions' is empty: expected at least one position");
        }
        if (labels.size() > MAX_POSITIONS) {
            root.problem("positions", "'positions' has " + labels.size() + " entries: at most " + MAX_POSITIONS);
        }
        return labels;
    }

    private static int countOf(MapReader root, ConfigNode node) {
        try {
            long n = Long.parseLong(node.text());
            if (n >= 1 && n <= MAX_POSITIONS) {
                return (int) n;
            }
        } catch (NumberFormatException e) {
            // reported below
        }
        root.problem("positions", "'positions' is " + node.text() + ": expected a count from 1 to " + MAX_POSITIONS
                + " or a list of labels");
        return 0;
    }

    private static Pattern.Pass pass(MapReader p, int positions, Path dir, List<Problem> elsewhere, Set<String> names) {
        String name = p.string("name");
        if (!name.isEmpty() && !names.add(name)) {
            p.problem("name", "'" + p.path("name") + "': pass name \"" + name + "\" is used twice");
        }
        JointProgram program = program(p, dir, elsewhere);
        int[] order = order(p, positions);
        int attempts = 1;
        Acknowledge ack = Acknowledge.OPERATOR;
        MapReader rework = p.optionalMap("rework");
        if (rework != null) {
            attempts = rework.integer("attempts", 3, 1, 99);
            ack = rework.choice("acknowledge", "operator", ACKS).equals("supervisor")
                    ? Acknowledge.SUPERVISOR : Acknowledge.OPERATOR;
            rework.finish();
        } else {
            attempts = 3;
        }
        String after = p.choice("after_no_go", AfterNoGo.REJECT.key(), AFTER);
        AfterNoGo afterNoGo = AfterNoGo.valueOf(after.toUpperCase(java.util.Locale.ROOT));
        p.finish();
        if (program == null || order == null || order.length == 0 || name.isEmpty()) {
            return null;
        }
        return new Pattern.Pass(name, program, order, attempts, ack, afterNoGo);
    }

    private static JointProgram program(MapReader p, Path dir, List<Problem> elsewhere) {
        ConfigNode node = p.child("program");
        if (node == null || node.kind() == ConfigNode.Kind.NULL) {
            p.problem("program", "missing key '" + p.path("program")
                    + "': expected a joint program file name or an inline program");
            return null;
        }
        if (node.kind() == ConfigNode.Kind.MAP) {
            MapReader inline = MapReader.of(p.problems(), node);
            int before = p.problems().list().size();
            JointProgram program = ProgramFile.read(inline, "");
            inline.finish();
            return p.problems().list().size() == before ? program : null;
        }
        if (node.kind() != ConfigNode.Kind.STRING) {
            p.problem("program", "'" + p.path("program") + "': expected a file name or a map, got " + node.describe());
            return null;
        }
        Path file = dir == null ? Path.of(node.text()) : dir.resolve(node.text());
        try {
            return ProgramFile.load(file);
        } catch (ConfigException e) {
            if (e.problems().size() == 1 && e.problems().get(0).line() == 0) {
                p.problem("program", "'" + p.path("program") + "': cannot use program file " + node.text()
                        + ": " + e.problems().get(0).message());
            } else {
                p.problem("program", "'" + p.path("program") + "': program file " + node.text() + " is not valid");
                elsewhere.addAll(e.problems());
            }
            return null;
        }
    }

    private static int[] order(MapReader p, int positions) {
        ConfigNode node = p.child("order");
        if (node == null || node.kind() == ConfigNode.Kind.NULL) {
            return positions == 0 ? null : Order.cross(positions);
        }
        if (node.kind() == ConfigNode.Kind.STRING) {
            String v = node.text();
            if (!ORDERS.contains(v)) {
                p.problem("order", "'" + p.path("order") + "' is \"" + v
                        + "\": expected cross, circular or a list of position numbers");
                return null;
            }
            if (positions == 0) {
                return null;
            }
            return v.equals("cross") ? Order.cross(positions) : Order.circular(positions);
        }
        if (node.kind() != ConfigNode.Kind.LIST) {
            p.problem("order", "'" + p.path("order") + "': expected cross, circular or a list of position numbers, got "
                    + node.describe());
            return null;
        }
        int[] order = new int[node.items().size()];
        boolean[] used = new boolean[Math.max(positions, 0) + 1];
        int k = 0;
        boolean ok = true;
        for (ConfigNode item : node.items()) {
            int n = -1;
            if (item.kind() == ConfigNode.Kind.NUMBER) {
                try {
                    n = Integer.parseInt(item.text());
                } catch (NumberFormatException e) {
                    n = -1;
                }
            }
            if (n < 1 || n > positions) {
                p.problems().add(item, "'" + item.path() + "' is " + item.describe() + ": expected a position number from 1 to "
                        + positions);
                ok = false;
            } else if (used[n]) {
                p.problems().add(item, "'" + item.path() + "': position " + n + " is listed twice in this pass");
                ok = false;
            } else {
                used[n] = true;
                order[k] = n - 1;
            }
            k++;
        }
        if (order.length == 0) {
            p.problem("order", "'" + p.path("order") + "' is empty: expected at least one position");
            return null;
        }
        return ok ? order : null;
    }
}

package hammerstep.analysis;

import hammerstep.config.InputFiles;

import java.io.IOException;
import java.nio.file.Path;
import java.util.ArrayList;
import java.util.Arrays;
import java.util.List;

/**
 * Reads residual-torque audits from a CSV file of our own design (docs/engineer-guide.md):
 * {@code #} lines are comments, the header names the columns (any order), then one audit per row.
 * <pre>
 * joint_id,part_serial,position,method,residual_nm
 * j-000123,,,first_movement,86.5
 * ,TR-1001,3,breakaway,91.0
 * </pre>
 * A row names its joint by {@code joint_id} or by {@code part_serial} and {@code position};
 * {@code method} is {@code first_movement}, {@code breakaway} or {@code mark_return}.
 */
public final class AuditFile {

    static final List<String> COLUMNS = List.of("joint_id", "part_serial", "position", "method", "residual_nm");

    private AuditFile() {
    }

    public static List<Audit> read(Path file) throws InputException {
        List<Audit> audits = new ArrayList<>();
        try (InputFiles.Lines in = InputFiles.lines(file, InputFiles.MAX_TEXT_LINE_CHARS)) {
            String text;
            int line = 0;
            int[] col = null;
            while ((text = in.next()) != null) {
                line++;
                String s = text.strip();
                if (s.isEmpty() || s.startsWith("#")) {
                    continue;
                }
                String[] cells = split(s);
                if (col == null) {
                    col = header(file, line, cells);
                    continue;
                }
                audits.add(row(file, line, cells, col));
            }
            if (col == null) {
                throw new InputException(file + ": no header; expected the columns " + String.join(",", COLUMNS));
            }
        } catch (IOException e) {
            throw InputException.reading(file, e);
        }
        return audits;
    }

    private static int[] header(Path file, int line, String[] cells) throws InputException {
        int[] col = new int[COLUMNS.size()];
        Arrays.fill(col, -1);
        for (int i = 0; i < cells.length; i++) {
            int k = COLUMNS.indexOf(cells[i]);
            if (k < 0) {
                throw new InputException(file + ":" + line + ": unknown column '" + cells[i] + "'; expected "
                        + String.join(",", COLUMNS));
            }
            if (col[k] >= 0) {
                throw new InputException(file + ":" + line + ": column '" + cells[i] + "' given twice");
            }
            col[k] = i;
        }
        for (String needed : List.of("method", "residual_nm")) {
            if (col[COLUMNS.indexOf(needed)] < 0) {
                throw new InputException(file + ":" + line + ": the header needs a '" + needed + "' column");
            }
        }
        boolean byId = col[0] >= 0;
        boolean byPosition = col[1] >= 0 && col[2] >= 0;
        if (!byId && !byPosition) {
            throw new InputException(file + ":" + line + ": the header needs 'joint_id', or 'part_serial' and 'position'");
        }
        return col;
    }

    private static Audit row(Path file, int line, String[] cells, int[] col) throws InputException {
        String where = file + ":" + line + ": ";
        String id = cell(cells, col[0]);
        String serial = cell(cells, col[1]);
        String position = cell(cells, col[2]);
        if (id.isEmpty() && (serial.isEmpty() || position.isEmpty())) {
            throw new InputException(where + "give joint_id, or part_serial and position");
        }
        String methodText = cell(cells, col[3]);
        Audit.Method method = Audit.Method.ofKey(methodText);
        if (method == null) {
            throw new InputException(where + "method '" + methodText + "': expected first_movement, breakaway or mark_return");
        }
        String value = cell(cells, col[4]);
        double residual;
        try {
            residual = Double.parseDouble(value);
        } catch (NumberFormatException e) {
            throw new InputException(where + "residual_nm '" + InputFiles.quote(value) + "' is not a number");
        }
        if (!(residual > 0) || !(residual < 1e6)) {
            throw new InputException(where + "residual_nm " + InputFiles.quote(value) + " must be a positive torque in N·m, within any transducer's range");
        }
        return new Audit(line, id, serial, position, method, residual);
    }

    private static String cell(String[] cells, int index) {
        return index < 0 || index >= cells.length ? "" : cells[index];
    }

    private static String[] split(String s) {
        String[] cells = s.split(",", -1);
        for (int i = 0; i < cells.length; i++) {
            cells[i] = cells[i].strip();
        }
        return cells;
    }
}

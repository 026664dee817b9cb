package hammerstep.sequence;

import hammerstep.joint.JointProgram;

import java.util.List;

/**
 * A bolt pattern as the line engineer defined it: its positions and the passes that tighten them.
 *
 * @param id        pattern name as written in the file
 * @param revision  content hash of the pattern file ("" when built in code); program revisions are in the programs
 * @param positions the positions' labels; index 0 is position 1
 * @param passes    in the order they are run
 */
public record Pattern(String id, String revision, List<String> positions, List<Pass> passes) {

    public Pattern {
        positions = List.copyOf(positions);
        passes = List.copyOf(passes);
        if (positions.isEmpty()) {
            throw new IllegalArgumentException("a pattern needs at least one position");
        }
        if (passes.isEmpty()) {
            throw new IllegalArgumentException("a pattern needs at least one pass");
        }
        for (Pass p : passes) {
            for (int i : p.order()) {
                if (i < 0 || i >= positions.size()) {
                    throw new IllegalArgumentException("pass " + p.name() + " names position " + (i + 1)
                            + " of a " + positions.size() + "-position pattern");
                }
            }
        }
    }

    public int size() {
        return positions.size();
    }

    /**
     * One pass over the pattern.
     *
     * @param name     e.g. snug, final, check
     * @param program  the joint program each rundown of this pass is judged by
     * @param order    0-based position indices in tightening order; each at most once
     * @param attempts rundowns allowed per position in this pass, the first included (1 = no rework)
     */
    public record Pass(String name, JointProgram program, int[] order, int attempts, Acknowledge acknowledge,
                       AfterNoGo afterNoGo) {

        public Pass {
            order = order.clone();
            if (order.length == 0) {
                throw new IllegalArgumentException("pass " + name + " tightens no position");
            }
            if (attempts < 1) {
                throw new IllegalArgumentException("pass " + name + " allows no attempt");
            }
        }

        @Override
        public int[] order() {
            return order.clone();
        }

        public int orderLength() {
            return order.length;
        }

        /** The {@code k}-th position index of the order, without copying. */
        public int orderAt(int k) {
            return order[k];
        }
    }
}

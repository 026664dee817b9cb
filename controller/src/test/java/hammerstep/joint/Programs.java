package hammerstep.joint;

/** Programs for tests, built in code. */
final class Programs {

    private Programs() {
    }

    /** The DESIGN.md example: 180/200/230 N·m, blows above 40 N·m, 4 to 30 blows. */
    static JointProgram hubFinal() {
        return new JointProgram("hub-final", "", new JointProgram.Torque(180, 200, 230), FinalTorque.MAX_PEAK,
                new JointProgram.Blows(40, 20, 4, 30, 7.5), new JointProgram.Rundown(10, 200, 5000), 205, 2);
    }

    static JointProgram with(JointProgram p, FinalTorque f) {
        return new JointProgram(p.id(), p.revision(), p.torque(), f, p.blows(), p.rundown(), p.shutoffAtNm(), p.rehitBlows());
    }

    static JointProgram withoutShutoff(JointProgram p) {
        return new JointProgram(p.id(), p.revision(), p.torque(), p.finalTorque(), p.blows(), p.rundown(), Double.NaN, p.rehitBlows());
    }

    static JointProgram withMaxMs(JointProgram p, double maxMs) {
        return new JointProgram(p.id(), p.revision(), p.torque(), p.finalTorque(), p.blows(),
                new JointProgram.Rundown(p.rundown().startAboveNm(), p.rundown().endAfterMs(), maxMs), p.shutoffAtNm(), p.rehitBlows());
    }
}

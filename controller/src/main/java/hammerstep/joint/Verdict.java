package hammerstep.joint;

/** The judgement of one joint. */
public enum Verdict {
    GO,
    NO_GO
}

package hammerstep.analysis;

import org.junit.jupiter.api.DisplayName;
import org.junit.jupiter.api.Test;

import java.util.ArrayList;
import java.util.List;

import static org.assertj.core.api.Assertions.assertThat;
import static org.assertj.core.api.Assertions.within;

class AuditStudyTest {

    static final JointRecord.Limits LIMITS = new JointRecord.Limits(100, 140, 4, 20);
    static final double[] DYNAMIC = {100, 110, 120, 130, 140};
    static final double[] RESIDUAL = {81, 88, 97, 104, 110};

    static List<JointRecord> joints() {
        List<JointRecord> out = new ArrayList<>();
        for (int i = 0; i < DYNAMIC.length; i++) {
            out.add(new JointRecord(i + 1, "j-" + i, "cover-m10", "1", "CV-" + i, DYNAMIC[i], 8, "GO", List.of(), LIMITS));
        }
        return out;
    }

    static List<Audit> audits() {
        List<Audit> out = new ArrayList<>();
        for (int i = 0; i < RESIDUAL.length; i++) {
            // the first two by joint id, the rest by part serial and position
            out.add(i < 2 ? new Audit(i + 2, "j-" + i, "", "", Audit.Method.FIRST_MOVEMENT, RESIDUAL[i])
                    : new Audit(i + 2, "", "CV-" + i, "1", Audit.Method.FIRST_MOVEMENT, RESIDUAL[i]));
        }
        return out;
    }

    /*
     * Worked by hand (least squares and prediction interval, any statistics textbook):
     *   dynamic x = 100, 110, 120, 130, 140; residual y = 81, 88, 97, 104, 110
     *   x̄ = 120, ȳ = 96; Sxx = 400+100+0+100+400 = 1000; Syy = 225+64+1+64+196 = 550
     *   Sxy = (-20)(-15)+(-10)(-8)+0+(10)(8)+(20)(14) = 740
     *   b = 740/1000 = 0.74; a = 96 - 0.74*120 = 7.2
     *   fitted 81.2, 88.6, 96.0, 103.4, 110.8; errors -0.2, -0.6, 1.0, 0.6, -0.8; SSE = 2.4
     *   s_e = sqrt(2.4 / 3) = 0.894427; SE(b) = 0.894427 / sqrt(1000) = 0.028284
     *   SE(a) = 0.894427 * sqrt(1/5 + 120²/1000) = 0.894427 * 3.820995 = 3.417601
     *   r = 740 / sqrt(1000 * 550) = 0.997816
     *   offsets y - x: -19, -22, -23, -26, -30; mean -24.0; s = sqrt(70/4) = 4.183300
     *   t(0.975, 3) = 3.182446 (t table); t*s_e = 2.846467
     *   spec 85..105: lower edge L where 7.2 + 0.74 L - 2.846467*sqrt(1.2 + (L-120)²/1000) = 85
     *     try L = 109.54: 88.2596 - 2.846467*sqrt(1.2 + 0.10941) = 88.2596 - 3.2573 = 85.002 -> L ≈ 109.54
     *   upper edge U where 7.2 + 0.74 U + 2.846467*sqrt(1.2 + (U-120)²/1000) = 105
     *     try U = 127.84: 101.8016 + 2.846467*sqrt(1.2 + 0.06147) = 101.8016 + 3.1970 = 104.999 -> U ≈ 127.84
     */
    @Test
    @DisplayName("fit, offset, correlation and window match a hand-worked example (least squares, t prediction interval)")
    void matchesTheHandWorkedExample() {
        AuditStudy.Report r = AuditStudy.of(audits(), joints(), 85, 105, 0.95);

        assertThat(r.unpaired()).isEmpty();
        AuditStudy.Group g = r.groups().get(0);
        assertThat(g.n()).isEqualTo(5);
        assertThat(g.meanOffsetNm()).isCloseTo(-24.0, within(1e-9));
        assertThat(g.sdOffsetNm()).isCloseTo(4.183300, within(1e-6));
        LinearFit f = g.fit();
        assertThat(f.b()).isCloseTo(0.74, within(1e-12));
        assertThat(f.a()).isCloseTo(7.2, within(1e-9));
        assertThat(f.se()).isCloseTo(0.894427, within(1e-6));
        assertThat(f.seB()).isCloseTo(0.028284, within(1e-6));
        assertThat(f.seA()).isCloseTo(3.417601, within(1e-6));
        assertThat(f.r()).isCloseTo(0.997816, within(1e-6));
        assertThat(g.slopeSignificant()).isTrue();
        assertThat(g.window().minNm()).isCloseTo(109.54, within(0.01));
        assertThat(g.window().maxNm()).isCloseTo(127.84, within(0.01));
        assertThat(g.window().extrapolated()).isFalse();
        // at the edges the prediction interval touches the specification exactly
        assertThat(f.predict(g.window().minNm()) - f.predictionHalfWidth(g.window().minNm(), 0.95)).isCloseTo(85, within(1e-6));
        assertThat(f.predict(g.window().maxNm()) + f.predictionHalfWidth(g.window().maxNm(), 0.95)).isCloseTo(105, within(1e-6));
    }

    @Test
    void saysWhenTheSpecificationIsNarrowerThanTheScatter() {
        AuditStudy.Report r = AuditStudy.of(audits(), joints(), 95, 98, 0.95);

        assertThat(r.groups().get(0).window()).isNull();
        assertThat(r.groups().get(0).note()).contains("too wide");
    }

    @Test
    void marksAWindowReachingBeyondTheAuditedRange() {
        AuditStudy.Report r = AuditStudy.of(audits(), joints(), 70, 130, 0.95);

        assertThat(r.groups().get(0).window().extrapolated()).isTrue();
        assertThat(r.groups().get(0).note()).contains("outside the audited dynamic range");
    }

    @Test
    void refusesAWindowWhenResidualDoesNotFollowDynamic() {
        List<Audit> audits = new ArrayList<>();
        double[] flat = {97, 92, 99, 91, 96};
        for (int i = 0; i < 5; i++) {
            audits.add(new Audit(i + 2, "j-" + i, "", "", Audit.Method.BREAKAWAY, flat[i]));
        }

        AuditStudy.Group g = AuditStudy.of(audits, joints(), 85, 105, 0.95).groups().get(0);

        assertThat(g.slopeSignificant()).isFalse();
        assertThat(g.window()).isNull();
        assertThat(g.note()).contains("not significant");
    }

    @Test
    void keepsMethodsApartAndListsUnpairedAudits() {
        List<Audit> audits = new ArrayList<>(audits());
        audits.add(new Audit(20, "j-0", "", "", Audit.Method.BREAKAWAY, 90));
        audits.add(new Audit(21, "j-unknown", "", "", Audit.Method.BREAKAWAY, 90));
        audits.add(new Audit(22, "", "CV-9", "1", Audit.Method.BREAKAWAY, 90));

        AuditStudy.Report r = AuditStudy.of(audits, joints(), Double.NaN, Double.NaN, 0.95);

        assertThat(r.groups()).extracting(AuditStudy.Group::method)
                .containsExactly(Audit.Method.FIRST_MOVEMENT, Audit.Method.BREAKAWAY);
        assertThat(r.groups().get(1).fit()).isNull();
        assertThat(r.unpaired()).extracting(Audit::line).containsExactly(21, 22);
        assertThat(r.groups().get(0).note()).contains("--spec");
    }

    @Test
    void pairsByPositionWithTheLastRundownOnIt() {
        List<JointRecord> joints = new ArrayList<>(joints());
        joints.add(new JointRecord(9, "j-rework", "cover-m10", "1", "CV-4", 150, 3, "GO", List.of(), LIMITS));

        AuditStudy.Group g = AuditStudy.of(audits(), joints, Double.NaN, Double.NaN, 0.95).groups().get(0);

        assertThat(g.dynamicNm()).containsExactly(100, 110, 120, 130, 150);
    }
}

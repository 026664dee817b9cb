package hammerstep.sim.physics;

import hammerstep.config.MapReader;

import java.util.List;

/**
 * Reads the keys of tool, joint and transducer presets into their records. Problems go to the
 * reader's collector; every number is range-checked so a slip of a decimal point is reported
 * at its line rather than simulated.
 */
final class PresetReaders {

    private static final double BIG = 1e12;

    private PresetReaders() {
    }

    static ToolSpec tool(MapReader root, String label) {
        String name = root.string("name", label);
        root.string("description", "");
        DriveSpec drive = drive(root.map("drive"));
        MechanismSpec mechanism = mechanism(root.map("mechanism"));
        MapReader t = root.map("train");
        double anvil = t.requiredNumber("anvil_stiffness_nm_per_rad", 100, BIG);
        double socket = t.requiredNumber("socket_stiffness_nm_per_rad", 100, BIG);
        double extension = t.number("extension_stiffness_nm_per_rad", Double.POSITIVE_INFINITY, 100, BIG);
        double inertia = t.requiredNumber("inertia_kg_m2", 1e-7, 1);
        double damping = t.number("damping_ratio", 0.03, 0, 1);
        t.finish();
        return new ToolSpec(name, drive, mechanism, new ToolSpec.TrainSpec(anvil, socket, extension, inertia, damping));
    }

    private static DriveSpec drive(MapReader d) {
        String type = d.choice("type", "", List.of("cordless", "air"));
        if (type.isEmpty()) {
            d.problem("type", "missing key '" + d.path("type") + "': expected cordless or air");
            d.finish();
            return new DriveSpec.Air(6.3, 8000, 5, 1e-4, 0, 1);
        }
        DriveSpec spec;
        if (type.equals("cordless")) {
            MapReader b = d.map("battery");
            double volts = b.requiredNumber("voltage_v", 1, 200);
            double rb = b.requiredNumber("internal_resistance_ohm", 0, 10);
            b.finish();
            MapReader m = d.map("motor");
            double kv = m.requiredNumber("kv_rpm_per_v", 10, 100_000);
            double rw = m.requiredNumber("winding_resistance_ohm", 0.001, 100);
            double limit = m.requiredNumber("current_limit_a", 0.1, 10_000);
            double brake = m.number("brake_current_a", Double.isNaN(limit) ? 0 : limit, 0, 10_000);
            double jm = m.requiredNumber("inertia_kg_m2", 1e-8, 0.1);
            double drag = m.number("drag_nm_per_rad_s", 0, 0, 1);
            m.finish();
            MapReader g = d.map("gear");
            int sun = g.integer("sun_teeth", 3, 500);
            int planet = g.integer("planet_teeth", 3, 500);
            int ring = g.integer("ring_teeth", 6, 2000);
            double eff = g.number("efficiency", 0.95, 0.3, 1);
            if (sun > 0 && planet > 0 && ring > 0 && !Planetary.meshes(sun, planet, ring)) {
                g.problem("ring_teeth", "'" + g.path("ring_teeth") + "' is " + ring
                        + ": a planetary stage needs ring = sun + 2 × planet (" + (sun + 2 * planet) + ")");
            }
            g.finish();
            spec = new DriveSpec.Cordless(volts, rb, kv, rw, limit, brake, jm, drag, sun, planet, ring, eff);
        } else {
            double p0 = d.requiredNumber("reference_pressure_bar", 0.5, 20);
            double free = d.requiredNumber("free_speed_rpm", 100, 100_000);
            double stall = d.requiredNumber("stall_torque_nm", 0.01, 1000);
            double jr = d.requiredNumber("rotor_inertia_kg_m2", 1e-8, 0.1);
            double drag = d.number("drag_nm_per_rad_s", 0, 0, 1);
            double ratio = d.number("gear_ratio", 1, 0.1, 100);
            spec = new DriveSpec.Air(p0, free, stall, jr, drag, ratio);
        }
        d.finish();
        return spec;
    }

    private static MechanismSpec mechanism(MapReader m) {
        String type = m.choice("type", "", List.of("cam", "twin-hammer", "oil-pulse",
                "rocking-dog", "three-jaw", "twin-pin-oil-bath"));
        MechanismSpec spec;
        switch (type) {
            case "cam": {
                int dogs = m.integer("dogs", 2, 3);
                boolean skip = m.bool("skip", false);
                double jh = m.requiredNumber("hammer_inertia_kg_m2", 1e-7, 1);
                double js = m.requiredNumber("spindle_inertia_kg_m2", 1e-8, 1);
                MapReader s = m.map("spring");
                double preload = s.requiredNumber("preload_n", 0, 100_000);
                double rate = s.requiredNumber("rate_n_per_mm", 0.1, 100_000) * 1e3;
                s.finish();
                double lead = m.requiredNumber("cam_lead_mm_per_rad", 0.1, 100) * 1e-3;
                double height = m.requiredNumber("dog_height_mm", 0.1, 50) * 1e-3;
                double arc = Math.toRadians(m.requiredNumber("dog_arc_deg", 1, 170));
                double travel = Math.toRadians(m.number("ball_travel_deg", 120, 5, 180));
                if (skip && dogs != 3) {
                    m.problem("skip", "'" + m.path("skip") + "': skip mode needs 3 dogs");
                }
                double climb = lead > 0 ? Math.toDegrees(height / lead) : 0;
                if (climb >= Math.toDegrees(travel)) {
                    m.problem("dog_height_mm", "'" + m.path("dog_height_mm") + "': the climb to release ("
                            + Math.round(climb) + "°) must be shorter than ball_travel_deg");
                }
                spec = new MechanismSpec.Cam(dogs, skip, jh, js, preload, rate, lead, height, arc, travel);
                break;
            }
            case "twin-hammer": {
                double jc = m.requiredNumber("cage_inertia_kg_m2", 1e-7, 1);
                double arc = Math.toRadians(m.requiredNumber("dog_arc_deg", 1, 170));
                double coNm = m.requiredNumber("cam_out_torque_nm", 0, 10_000);
                double coMs = m.number("cam_out_ms", 3.0, 0.1, 1000);
                spec = new MechanismSpec.TwinHammer(jc, arc, coNm, coMs);
                break;
            }
            case "oil-pulse": {
                double jl = m.requiredNumber("liner_inertia_kg_m2", 1e-7, 1);
                int pulses = m.integer("pulses_per_rev", 1, 1, 2);
                double window = Math.toRadians(m.requiredNumber("window_deg", 1, 170));
                double k = m.requiredNumber("oil_stiffness_nm_per_rad", 1, BIG);
                double leak = m.requiredNumber("leak_time_constant_ms", 0.01, 10_000);
                double relief = m.requiredNumber("relief_torque_nm", 1, 10_000);
                double vent = m.number("vent_time_constant_ms", 0.2, 0.001, 1000);
                double shear = m.number("shear_nm_per_rad_s", 0.0, 0, 1);
                spec = new MechanismSpec.OilPulse(jl, pulses, window, k, leak, relief, vent, shear);
                break;
            }
            case "rocking-dog":
            case "three-jaw":
            case "twin-pin-oil-bath":
                spec = ClutchReader.read(type, m);
                break;
            default:
                if (!m.has("type")) {
                    m.problem("type", "missing key '" + m.path("type") + "': expected cam, twin-hammer, oil-pulse, rocking-dog, three-jaw or twin-pin-oil-bath");
                }
                spec = new MechanismSpec.TwinHammer(1e-3, 0.5, 10, 3);
                break;
        }
        m.finish();
        return spec;
    }

    static JointSpec joint(MapReader r, String label) {
        String name = r.string("name", label);
        r.string("description", "");
        double prevailing = r.requiredNumber("prevailing_torque_nm", 0, 1000);
        double free = Math.toRadians(r.requiredNumber("free_angle_deg", 0, 36_000));
        double full = r.requiredNumber("full_torque_nm", 0.1, 100_000);
        double toFull = Math.toRadians(r.requiredNumber("angle_to_full_deg", 0.5, 36_000));
        if (full <= prevailing) {
            r.problem("full_torque_nm", "'full_torque_nm' (" + full + ") must be above prevailing_torque_nm ("
                    + prevailing + ")");
        }
        MapReader f = r.map("friction");
        double ratio = f.number("static_ratio", 1.1, 1, 3);
        double scatter = f.number("scatter", 0.0, 0, 0.3);
        double blow = f.number("blow_scatter", 0.0, 0, 0.2);
        FrictionSpec law = frictionLaw(f);
        f.finish();
        MapReader t = r.map("thread");
        double d = t.requiredNumber("diameter_mm", 1, 200) * 1e-3;
        double k = t.requiredNumber("k_factor", 0.05, 0.5);
        t.finish();
        Bolt bolt = bolt(r.optionalMap("bolt"), d);
        MapReader x = r.optionalMap("relaxation");
        double loss = 0;
        double tau = 100;
        if (x != null) {
            loss = x.number("loss", 0, 0, 0.5);
            tau = x.number("time_constant_ms", 100, 1, 1e6);
            x.finish();
        }
        JointSpec joint = new JointSpec(name, prevailing, free, full, toFull, ratio, scatter, blow, k, d, loss, tau, bolt, law);
        if (law != null && !Double.isNaN(d) && ThreadGeometry.of(joint) == null) {
            f.problem("model", "'" + f.path("model") + "': a friction law needs an ISO metric size M6 to M30 (thread.diameter_mm)");
        }
        return joint;
    }

    /**
     * {@code friction: { model: stribeck, lubrication: oiled }}; null when no model is named (the single torque
     * coefficient). A model replaces {@code static_ratio} and {@code scatter}, so they may not stand beside it.
     */
    private static FrictionSpec frictionLaw(MapReader f) {
        if (!f.has("model")) {
            if (f.has("lubrication")) {
                f.problem("lubrication", "'" + f.path("lubrication") + "' needs a 'model' beside it: expected one of "
                        + String.join(", ", FrictionSpec.MODEL_KEYS));
            }
            return null;
        }
        String model = f.choice("model", "", FrictionSpec.MODEL_KEYS);
        String lubrication = f.choice("lubrication", "", FrictionSpec.LUBRICATION_KEYS);
        if (!f.has("lubrication")) {
            f.problem("lubrication", "missing key '" + f.path("lubrication") + "': a friction model needs one of "
                    + String.join(", ", FrictionSpec.LUBRICATION_KEYS));
        }
        for (String replaced : new String[] {"static_ratio", "scatter"}) {
            if (f.has(replaced)) {
                f.problem(replaced, "'" + f.path(replaced) + "' applies without a friction model only: the model draws"
                        + " static and kinetic coefficients itself");
            }
        }
        FrictionSpec.Model m = FrictionSpec.Model.of(model);
        FrictionSpec.Lubrication l = FrictionSpec.Lubrication.of(lubrication);
        return m == null || l == null ? null : new FrictionSpec(m, l);
    }

    /** {@code bolt: { size: M16, property_class: 10.9 }} or {@code size: M14x1.5}; null when absent. */
    private static Bolt bolt(MapReader b, double threadDiameterM) {
        if (b == null) {
            return null;
        }
        String size = b.string("size");
        String cls = b.choice("property_class", "", Bolt.CLASSES);
        if (!b.has("property_class")) {
            b.problem("property_class", "missing key '" + b.path("property_class") + "': expected one of "
                    + String.join(", ", Bolt.CLASSES));
        }
        b.finish();
        java.util.regex.Matcher m = java.util.regex.Pattern.compile("M(\\d+(?:\\.\\d+)?)(?:[x×](\\d+(?:\\.\\d+)?))?")
                .matcher(size);
        if (!m.matches()) {
            if (!size.isEmpty()) {
                b.problem("size", "'" + b.path("size") + "' is \"" + size + "\": expected a metric size such as M16 or M14x1.5");
            }
            return null;
        }
        double diameterMm = Double.parseDouble(m.group(1));
        double pitchMm = m.group(2) != null ? Double.parseDouble(m.group(2)) : Bolt.coarsePitchMm(diameterMm);
        if (Double.isNaN(pitchMm)) {
            b.problem("size", "'" + b.path("size") + "' is \"" + size + "\": no coarse pitch known for it; give the pitch, e.g. M"
                    + m.group(1) + "x1.5");
            return null;
        }
        if (!Double.isNaN(threadDiameterM) && Math.abs(diameterMm * 1e-3 - threadDiameterM) > 1e-9) {
            b.problem("size", "'" + b.path("size") + "' is " + size + " but thread.diameter_mm is "
                    + Math.round(threadDiameterM * 1e3) + ": the same bolt");
        }
        return cls.isEmpty() ? null : new Bolt(size, diameterMm, pitchMm, cls);
    }

    static TransducerSpec transducer(MapReader r, String label) {
        String name = r.string("name", label);
        r.string("description", "");
        double rated = r.requiredNumber("rated_torque_nm", 0.1, 100_000);
        double k = r.requiredNumber("shaft_stiffness_nm_per_rad", 100, BIG);
        double j = r.number("inertia_kg_m2", 0, 0, 1);
        double bw = r.requiredNumber("bandwidth_hz", 10, 200_000);
        double noise = r.number("noise_nm_rms", 0, 0, 1000);
        double offset = r.number("offset_nm", 0, -1000, 1000);
        double gain = r.number("gain_error", 0, -0.5, 0.5);
        MapReader a = r.map("adc");
        int bits = a.integer("bits", 8, 32);
        double range = a.requiredNumber("range_nm", 0.1, 1_000_000);
        a.finish();
        if (!Double.isNaN(range) && !Double.isNaN(rated) && range < rated) {
            r.problem("adc", "'adc.range_nm' (" + range + ") must not be below rated_torque_nm (" + rated + ")");
        }
        return new TransducerSpec(name, rated, k, j, bw, noise, offset, gain, bits, range);
    }
}

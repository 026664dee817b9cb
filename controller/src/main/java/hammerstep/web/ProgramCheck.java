package hammerstep.web;

import hammerstep.config.ConfigException;
import hammerstep.config.ConfigNode;
import hammerstep.config.InputFiles;
import hammerstep.config.Problem;
import hammerstep.config.YamlDocument;
import hammerstep.joint.JointProgram;
import hammerstep.joint.ProgramFile;

import java.util.ArrayList;
import java.util.List;

/**
 * A joint program sent to the view (uploaded, or edited in the page), validated by the same reader
 * as {@code hammerstep check} with the same lines: {@code file:line:column: message}, the file named
 * as the engineer's file was named (or {@value #EDITED} for the page's text).
 */
final class ProgramCheck {

    /** The name given to a program edited in the page. */
    static final String EDITED = "edited.yaml";

    /** The program, or the lines saying what is wrong with it. */
    record Checked(JointProgram program, List<String> problems) {
    }

    private ProgramCheck() {
    }

    static Checked of(String fileName, byte[] bytes) {
        try {
            YamlDocument doc = YamlDocument.parse(fileName, bytes);
            ConfigNode root = doc.root();
            if (root.kind() != ConfigNode.Kind.MAP) {
                throw new ConfigException(new Problem(doc.file(), root.line(), root.column(),
                        "expected a map of keys at the top of the file, got " + root.describe()));
            }
            if (!root.entries().containsKey("torque")) {
                throw new ConfigException(new Problem(doc.file(), root.line(), root.column(),
                        "not a joint program: a joint program has 'torque'"));
            }
            return new Checked(ProgramFile.read(doc), List.of());
        } catch (ConfigException e) {
            List<String> lines = new ArrayList<>();
            for (Problem p : e.problems()) {
                lines.add(InputFiles.errorLine(p.toString()));
            }
            return new Checked(null, lines);
        }
    }

    /** A browser's file name made safe for a message: its last part, letters, digits, '.', '_', '-'. */
    static String safeName(String name) {
        if (name == null || name.isBlank()) {
            return EDITED;
        }
        String n = WhatIfRun.nameOf(name).replaceAll("[^A-Za-z0-9._-]", "_");
        return n.isEmpty() ? EDITED : n.length() > 64 ? n.substring(0, 64) : n;
    }
}

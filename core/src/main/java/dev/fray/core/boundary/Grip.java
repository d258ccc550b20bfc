package dev.fray.core.boundary;

import dev.fray.core.error.Checks;

/**
 * A region of a body whose material follows a prescribed motion, for pulling, tearing and peeling. The particles
 * of the body that lie in the region at the start are gripped; grid nodes they touch take the grip's velocity.
 *
 * @param name   name for messages
 * @param body   name of the body gripped
 * @param region region selecting the gripped particles at time 0
 * @param motion the prescribed motion
 */
public record Grip(String name, String body, Shape region, Motion motion) {
    /** Checks the fields. */
    public Grip {
        Checks.notNull("grip name", name);
        Checks.notNull("body of grip \"" + name + "\"", body);
        Checks.notNull("region of grip \"" + name + "\"", region);
        motion = motion == null ? Motion.STILL : motion;
    }
}

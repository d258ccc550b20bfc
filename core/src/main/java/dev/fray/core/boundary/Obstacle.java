package dev.fray.core.boundary;

import dev.fray.core.error.Checks;

/**
 * A rigid obstacle: a shape (its pose at time 0), a contact law and a prescribed motion. The contact law acts on
 * the grid nodes inside the obstacle and, after each step, on any particle that ended the step inside it: that
 * particle is put back on the surface along the outward normal. So material does not pass through obstacles
 * thinner than a grid cell, such as the edge of a wedge.
 *
 * @param name    name for messages and outputs
 * @param shape   solid region at time 0
 * @param contact contact law on its surface
 * @param motion  prescribed rigid motion
 */
public record Obstacle(String name, Shape shape, Contact contact, Motion motion) {
    /** Checks the fields. */
    public Obstacle {
        Checks.notNull("obstacle name", name);
        Checks.notNull("shape of obstacle \"" + name + "\"", shape);
        Checks.notNull("contact of obstacle \"" + name + "\"", contact);
        motion = motion == null ? Motion.STILL : motion;
    }

    /**
     * @param name  name
     * @param shape solid region
     * @return a still obstacle with separating contact and no friction
     */
    public static Obstacle of(String name, Shape shape) {
        return new Obstacle(name, shape, Contact.separating(0), Motion.STILL);
    }

    /**
     * @param c contact law
     * @return a copy with this contact
     */
    public Obstacle withContact(Contact c) {
        return new Obstacle(name, shape, c, motion);
    }

    /**
     * @param m prescribed motion
     * @return a copy with this motion
     */
    public Obstacle withMotion(Motion m) {
        return new Obstacle(name, shape, contact, m);
    }
}

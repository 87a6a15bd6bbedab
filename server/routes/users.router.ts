/** People administration (admin): list, add, change roles, deactivate. */
import { Router } from "express";
import { idParam } from "@shared/schemas/common";
import {
  createUserInput,
  updateUserInput,
  userListQuery,
  type CreateUserInput,
  type UpdateUserInput,
  type UserListQuery,
} from "@shared/schemas/users";
import type { Ctx } from "../context";
import { currentUser, requireRole } from "../middleware/auth";
import { body, params, query, validate } from "../middleware/validate";
import { presentUserAdmin } from "../presenters/user.presenter";

export function createUsersRouter(ctx: Ctx): Router {
  const r = Router();
  const users = ctx.services.users;
  r.use(requireRole("admin"));

  r.get("/", validate({ query: userListQuery }), async (req, res) => {
    const page = await users.list(query<UserListQuery>(req));
    res.json({ items: page.items.map(presentUserAdmin), total: page.total });
  });

  r.post("/", validate({ body: createUserInput }), async (req, res) => {
    const user = await users.create(currentUser(req).id, body<CreateUserInput>(req));
    res.status(201).json({ user: presentUserAdmin(user) });
  });

  r.patch("/:id", validate({ params: idParam, body: updateUserInput }), async (req, res) => {
    const user = await users.update(currentUser(req).id, params<{ id: number }>(req).id, body<UpdateUserInput>(req));
    res.json({ user: presentUserAdmin(user) });
  });

  return r;
}

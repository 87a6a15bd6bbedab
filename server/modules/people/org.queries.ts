/** Departments and research groups, by name: the person forms and the people table pick from them. */
import type { DataSource } from "typeorm";
import { Department, ResearchGroup } from "../../entities";

export const listDepartments = (ds: DataSource): Promise<Department[]> => ds.getRepository(Department).find({ order: { name: "ASC" } });

export const listGroups = (ds: DataSource): Promise<ResearchGroup[]> => ds.getRepository(ResearchGroup).find({ order: { name: "ASC" } });

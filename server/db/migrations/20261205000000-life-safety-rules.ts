import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * What the life-safety rules need to know of the premises and the panel:
 * - rooms: the hall or landing serving a bedroom's sleeping area (and whether its door was
 *   confirmed within 21 ft of that hall's alarm), and the bedroom a bathroom is attached to;
 * - panels: occupancy, standby and alarm currents, the standby battery (Ah and label date), and
 *   how soon the monitoring center learns that the panel's path has failed.
 */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('rooms', 'servedByHallId', { type: DataTypes.UUID, allowNull: true });
  await qi.addColumn('rooms', 'hallWithin21FtConfirmed', { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false });
  await qi.addColumn('rooms', 'attachedToBedroomId', { type: DataTypes.UUID, allowNull: true });
  await qi.addColumn('panels', 'occupancy', { type: DataTypes.STRING(20), allowNull: false, defaultValue: 'household' });
  await qi.addColumn('panels', 'standbyCurrentMa', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('panels', 'alarmCurrentMa', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('panels', 'batteryAh', { type: DataTypes.DOUBLE, allowNull: true });
  await qi.addColumn('panels', 'batteryManufacturedOn', { type: DataTypes.DATEONLY, allowNull: true });
  await qi.addColumn('panels', 'pathFailureReportMin', { type: DataTypes.INTEGER, allowNull: true });
}

export async function down(qi: QueryInterface): Promise<void> {
  for (const column of ['pathFailureReportMin', 'batteryManufacturedOn', 'batteryAh', 'alarmCurrentMa', 'standbyCurrentMa', 'occupancy']) {
    await qi.removeColumn('panels', column);
  }
  for (const column of ['attachedToBedroomId', 'hallWithin21FtConfirmed', 'servedByHallId']) {
    await qi.removeColumn('rooms', column);
  }
}

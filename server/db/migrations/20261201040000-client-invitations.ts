import { DataTypes, type QueryInterface } from 'sequelize';

/** A client invitation names the client record the invitee's sign-in is linked to. */
export async function up(qi: QueryInterface): Promise<void> {
  await qi.addColumn('invitations', 'clientId', {
    type: DataTypes.UUID,
    allowNull: true,
    references: { model: 'clients', key: 'id' },
    onDelete: 'CASCADE',
  });
}

export async function down(qi: QueryInterface): Promise<void> {
  await qi.removeColumn('invitations', 'clientId');
}
